import { z } from 'zod';
import { batchListQuerySchema } from './batches';
import { lotListQuerySchema } from './bottles';
import { vesselListQuerySchema } from './vessels';

/** What a CSV export can hold: one table of the cellar's record per file. */
export const EXPORT_TABLES = ['batches', 'journal', 'readings', 'vessels', 'lots', 'cases', 'departures'] as const;
export const exportTableSchema = z.enum(EXPORT_TABLES);
export type ExportTable = z.infer<typeof exportTableSchema>;

const booleanQuery = z.enum(['true', 'false']).transform((v) => v === 'true');

/** How the file is written: units as the person works, and a byte-order mark for spreadsheets. */
export const exportFormatSchema = z.object({
  units: z.enum(['metric', 'us']).default('metric'),
  bom: booleanQuery.default(false),
});

/** The list filters each table accepts (the same as its page's), without paging. */
const { page: _bp, pageSize: _bs, ...batchFilter } = batchListQuerySchema.shape;
const { page: _vp, pageSize: _vs, ...vesselFilter } = vesselListQuerySchema.shape;
const { page: _lp, pageSize: _ls, ...lotFilter } = lotListQuerySchema.shape;

export const batchExportQuerySchema = exportFormatSchema.extend(batchFilter);
export const vesselExportQuerySchema = exportFormatSchema.extend(vesselFilter);
export const lotExportQuerySchema = exportFormatSchema.extend(lotFilter);
/** Journal entries and readings: the whole cellar, or one batch. */
export const journalExportQuerySchema = exportFormatSchema.extend({ batchId: z.uuid().optional() });

export type ExportFormat = z.output<typeof exportFormatSchema>;
export type BatchExportQuery = z.input<typeof batchExportQuerySchema>;
export type VesselExportQuery = z.input<typeof vesselExportQuerySchema>;
export type LotExportQuery = z.input<typeof lotExportQuerySchema>;

// ---- Audit ---------------------------------------------------------------------------------

export const AUDIT_KINDS = ['journal', 'vessel', 'departure', 'import'] as const;
export const auditKindSchema = z.enum(AUDIT_KINDS);
export type AuditKind = z.infer<typeof auditKindSchema>;

const day = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'a date like 2026-03-01');

export const auditQuerySchema = z.object({
  personId: z.uuid().optional(),
  kind: auditKindSchema.optional(),
  /** First and last day (in the cellar's time zone), both included. */
  from: day.optional(),
  to: day.optional(),
  batchId: z.uuid().optional(),
  vesselId: z.uuid().optional(),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(50),
});
export type AuditQuery = z.input<typeof auditQuerySchema>;

export const auditRecordSchema = z.object({
  id: z.string(),
  kind: auditKindSchema,
  /** What was done, in the record's own words: a journal kind, a vessel change, a departure reason. */
  action: z.string(),
  at: z.string(),
  person: z.object({ id: z.uuid(), name: z.string() }).nullable(),
  batch: z.object({ id: z.uuid(), name: z.string() }).nullable(),
  vessel: z.object({ id: z.uuid(), name: z.string() }).nullable(),
  summary: z.string(),
});
export type AuditRecord = z.infer<typeof auditRecordSchema>;

export const auditPageSchema = z.object({
  items: z.array(auditRecordSchema),
  total: z.number().int(),
  page: z.number().int(),
  pageSize: z.number().int(),
  people: z.array(z.object({ id: z.uuid(), name: z.string() })),
});
export type AuditPage = z.infer<typeof auditPageSchema>;

// ---- CSV import ----------------------------------------------------------------------------

export const IMPORT_TARGETS = ['readings', 'vessels'] as const;
export type ImportTarget = (typeof IMPORT_TARGETS)[number];
export const DELIMITERS = [',', ';', '\t', '|'] as const;
export const DATE_FORMATS = ['iso', 'dmy', 'mdy'] as const;
export type DateFormat = (typeof DATE_FORMATS)[number];

/** The fields each import fills, in the order the mapping screen asks for them. */
export const IMPORT_FIELDS = {
  readings: ['at', 'sg', 'temperature', 'ph'],
  vessels: ['name', 'capacity', 'kind', 'material', 'state', 'notes'],
} as const satisfies Record<ImportTarget, readonly string[]>;
export const REQUIRED_FIELDS: Record<ImportTarget, readonly string[]> = { readings: ['at', 'sg'], vessels: ['name', 'capacity'] };

/** How to read the file: chosen on the mapping screen (the preview suggests each one). */
export const importOptionsSchema = z.object({
  delimiter: z.enum(DELIMITERS).default(','),
  dateFormat: z.enum(DATE_FORMATS).default('iso'),
  temperatureUnit: z.enum(['C', 'F']).default('C'),
  gravityUnit: z.enum(['sg', 'plato', 'brix']).default('sg'),
  volumeUnit: z.enum(['L', 'US gal', 'imp gal']).default('L'),
  /** 1,05 rather than 1.05 (files written with a European locale). */
  decimalComma: booleanQuery.default(false),
  /** Which header of the file fills each field: a JSON object, e.g. {"at":"Date","sg":"Gravity"}. */
  columns: z
    .string()
    .max(4000)
    .transform((text, ctx) => {
      try {
        return z.record(z.string(), z.string().max(200)).parse(JSON.parse(text));
      } catch {
        ctx.addIssue({ code: 'custom', message: 'a JSON object of field → column header' });
        return z.NEVER;
      }
    }),
});
export type ImportOptions = z.output<typeof importOptionsSchema>;
export const readingImportQuerySchema = importOptionsSchema.extend({ batchId: z.uuid() });
export const previewQuerySchema = z.object({ target: z.enum(IMPORT_TARGETS) });

/** What the mapping screen shows before anything is written. */
export const importPreviewSchema = z.object({
  delimiter: z.enum(DELIMITERS),
  headers: z.array(z.string()),
  rows: z.array(z.array(z.string())),
  /** field → header the preview matched by name (the person can change each). */
  suggestedColumns: z.record(z.string(), z.string()),
  dateFormat: z.enum(DATE_FORMATS).nullable(),
  temperatureUnit: z.enum(['C', 'F']),
  gravityUnit: z.enum(['sg', 'plato', 'brix']),
  volumeUnit: z.enum(['L', 'US gal', 'imp gal']),
  decimalComma: z.boolean(),
  /** Things worth a second look (unknown columns, a date that reads two ways). */
  notes: z.array(z.string()),
});
export type ImportPreview = z.infer<typeof importPreviewSchema>;

/** A refused import lists every problem found, by row (1 = the first after the header) and column. */
export const importProblemSchema = z.object({ row: z.number().int(), column: z.string(), message: z.string() });
export type ImportProblem = z.infer<typeof importProblemSchema>;

export const importResultSchema = z.object({ added: z.number().int(), alreadyImported: z.number().int(), rows: z.number().int() });
export type ImportResult = z.infer<typeof importResultSchema>;
