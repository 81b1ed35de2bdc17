import { z } from 'zod';

/** Line height as a multiple of the font size, for fitting and drawing alike. */
export const LINE_HEIGHT = 1.2;
/** Points per millimetre (PDF user space is 1/72 inch). */
export const PT_PER_MM = 72 / 25.4;
/** Rounding slack when checking that boxes fit, in millimetres. */
const SLACK_MM = 0.01;

/** The text each kind of label can show; a template places any of them. */
export const LABEL_FIELDS = {
  vessel: ['name', 'code', 'capacity', 'batch', 'kind', 'started', 'og', 'abv', 'printed'],
  case: ['batch', 'code', 'kind', 'bottled', 'contents', 'abv', 'sulfites'],
  lot: ['batch', 'code', 'kind', 'bottled', 'contents', 'abv', 'sulfites'],
} as const;

const length = z.number().nonnegative('a length in mm cannot be negative');
const size = z.number().positive('a size in mm must be more than 0');

/** A rectangle in mm, relative to the label's top-left corner. */
const boxSchema = z.object({ x: length, y: length, w: size, h: size }).strict();
type Box = z.infer<typeof boxSchema>;

function fieldSchema<F extends readonly [string, ...string[]]>(names: F) {
  return z
    .object({
      field: z.enum(names),
      box: boxSchema,
      /** Largest and smallest font size in points; text shrinks, then wraps, then is cut with "…". */
      maxPt: z.number().min(4).max(72),
      minPt: z.number().min(4).max(72),
      weight: z.enum(['regular', 'medium', 'semibold', 'bold']).default('regular'),
      align: z.enum(['left', 'center', 'right']).default('left'),
    })
    .strict()
    .refine((f) => f.minPt <= f.maxPt, { message: 'minPt must not be above maxPt', path: ['minPt'] })
    .refine((f) => f.box.h * PT_PER_MM + 1e-6 >= f.minPt * LINE_HEIGHT, {
      message: `box too short for one line at minPt (needs minPt × ${LINE_HEIGHT} pt)`,
      path: ['box', 'h'],
    });
}

function layoutSchema<F extends readonly [string, ...string[]]>(names: F) {
  return z
    .object({
      /** The QR square including its quiet zone of 4 modules on every side. */
      qr: z.object({ x: length, y: length, size }).strict(),
      fields: z.array(fieldSchema(names)).min(1, 'place at least one text field'),
    })
    .strict();
}

export const labelTemplateSchema = z
  .object({
    /** Also the file name: labels/<id>.json. Size and grid, never a vendor's code. */
    id: z.string().regex(/^[a-z0-9]+(-[a-z0-9]+)*$/, 'lower-case words and digits joined by "-"'),
    name: z.string().min(1).max(80),
    description: z.string().max(300).default(''),
    kind: z.enum(['sheet', 'roll']),
    /** The sheet, or one piece of a roll (all lengths in mm). */
    page: z.object({ width: size, height: size }).strict(),
    grid: z
      .object({
        columns: z.number().int().min(1).max(20),
        rows: z.number().int().min(1).max(40),
        top: length,
        left: length,
        gapX: length.default(0),
        gapY: length.default(0),
      })
      .strict(),
    label: z.object({ width: size, height: size }).strict(),
    layouts: z
      .object({
        vessel: layoutSchema(LABEL_FIELDS.vessel),
        case: layoutSchema(LABEL_FIELDS.case),
        lot: layoutSchema(LABEL_FIELDS.lot),
      })
      .strict(),
  })
  .strict()
  .superRefine((t, ctx) => {
    const { grid, label, page } = t;
    const usedW = grid.left + grid.columns * label.width + (grid.columns - 1) * grid.gapX;
    const usedH = grid.top + grid.rows * label.height + (grid.rows - 1) * grid.gapY;
    if (usedW > page.width + SLACK_MM) {
      ctx.addIssue({ code: 'custom', path: ['grid'], message: `the grid is ${usedW.toFixed(2)} mm wide; the page only ${page.width} mm` });
    }
    if (usedH > page.height + SLACK_MM) {
      ctx.addIssue({ code: 'custom', path: ['grid'], message: `the grid is ${usedH.toFixed(2)} mm tall; the page only ${page.height} mm` });
    }
    if (t.kind === 'roll' && grid.columns * grid.rows !== 1) {
      ctx.addIssue({ code: 'custom', path: ['grid'], message: 'a roll template has one label per page (1 × 1)' });
    }
    for (const kind of ['vessel', 'case', 'lot'] as const) {
      const layout = t.layouts[kind];
      const qr: Box = { x: layout.qr.x, y: layout.qr.y, w: layout.qr.size, h: layout.qr.size };
      if (!inside(qr, label)) ctx.addIssue({ code: 'custom', path: ['layouts', kind, 'qr'], message: 'the QR square leaves the label' });
      layout.fields.forEach((f, i) => {
        const path = ['layouts', kind, 'fields', i, 'box'];
        if (!inside(f.box, label)) ctx.addIssue({ code: 'custom', path, message: `the ${f.field} box leaves the label` });
        if (overlaps(f.box, qr)) ctx.addIssue({ code: 'custom', path, message: `the ${f.field} box overlaps the QR code or its quiet zone` });
      });
    }
  });

export type LabelTemplate = z.output<typeof labelTemplateSchema>;
export type LabelLayout = LabelTemplate['layouts']['vessel'];
export type LabelFieldSpec = LabelLayout['fields'][number];

function inside(b: Box, label: { width: number; height: number }): boolean {
  return b.x + b.w <= label.width + SLACK_MM && b.y + b.h <= label.height + SLACK_MM;
}

function overlaps(a: Box, b: Box): boolean {
  const eps = SLACK_MM;
  return a.x < b.x + b.w - eps && b.x < a.x + a.w - eps && a.y < b.y + b.h - eps && b.y < a.y + a.h - eps;
}
