import type { Writable } from 'node:stream';
import type { EntityManager } from 'typeorm';
import type { z } from 'zod';
import type { batchExportQuerySchema, journalExportQuerySchema, lotExportQuerySchema, vesselExportQuerySchema } from '../../shared/schemas/exchange';
import { listBatches } from '../batches/batch-reads.service';
import { listLots } from '../bottles/lot.service';
import { loadCellar } from '../cellars/load-cellar';
import { requireRole, type Actor } from '../core/actor';
import { listVessels } from '../vessels/vessel.service';
import type { UnitSystem } from './csv-cells';
import { inPages, writeCsv } from './csv-stream';
import {
  batchColumns,
  caseColumns,
  departureColumns,
  journalColumns,
  lotColumns,
  readingColumns,
  vesselColumns,
  type ExportStyle,
} from './export-columns';
import { departurePages, journalPages, readingPages } from './export-sources';

/**
 * CSV exports of the cellar's record, one table per file, streamed to `out` a page at a time.
 * Any member may export (a Guest reads everything anyway); the lists reuse the pages' own
 * filters, so a file holds what the page showed.
 */

type BatchExport = z.output<typeof batchExportQuerySchema>;
type VesselExport = z.output<typeof vesselExportQuerySchema>;
type LotExport = z.output<typeof lotExportQuerySchema>;
type JournalExport = z.output<typeof journalExportQuerySchema>;

async function styleOf(tx: EntityManager, cellarId: string, units: UnitSystem): Promise<ExportStyle> {
  return { units, timeZone: (await loadCellar(tx, cellarId)).timeZone };
}

export async function exportBatches(actor: Actor, tx: EntityManager, query: BatchExport, out: Writable): Promise<void> {
  requireRole(actor, 'guest');
  const { units, bom, ...filter } = query;
  const style = await styleOf(tx, actor.cellarId, units);
  const pages = inPages(async (page, pageSize) => (await listBatches(actor, tx, { ...filter, page, pageSize })).items);
  await writeCsv(out, batchColumns(style), pages, { bom });
}

export async function exportVessels(actor: Actor, tx: EntityManager, query: VesselExport, out: Writable): Promise<void> {
  requireRole(actor, 'guest');
  const { units, bom, ...filter } = query;
  const style = await styleOf(tx, actor.cellarId, units);
  const pages = inPages(async (page, pageSize) => (await listVessels(actor, tx, { ...filter, page, pageSize })).items);
  await writeCsv(out, vesselColumns(style), pages, { bom });
}

export async function exportLots(actor: Actor, tx: EntityManager, query: LotExport, out: Writable): Promise<void> {
  requireRole(actor, 'guest');
  const { bom, units: _units, ...filter } = query;
  const pages = inPages(async (page, pageSize) => (await listLots(actor, tx, { ...filter, page, pageSize })).items);
  await writeCsv(out, lotColumns(), pages, { bom });
}

/** Every case of the lots the filter keeps, lot by lot. */
export async function exportCases(actor: Actor, tx: EntityManager, query: LotExport, out: Writable): Promise<void> {
  requireRole(actor, 'guest');
  const { bom, units: _units, ...filter } = query;
  const pages = inPages(async (page, pageSize) => {
    const lots = (await listLots(actor, tx, { ...filter, page, pageSize })).items;
    return lots.flatMap((lot) => lot.cases.map((c) => ({ ...c, lotCode: lot.code, batchName: lot.batchName })));
  });
  await writeCsv(out, caseColumns(), pages, { bom });
}

export async function exportDepartures(actor: Actor, tx: EntityManager, query: LotExport, out: Writable): Promise<void> {
  requireRole(actor, 'guest');
  const style = await styleOf(tx, actor.cellarId, query.units);
  await writeCsv(out, departureColumns(style), departurePages(tx, actor.cellarId), { bom: query.bom });
}

/** One row per journal entry (amendments included, each pointing at what it corrects). */
export async function exportJournal(actor: Actor, tx: EntityManager, query: JournalExport, out: Writable): Promise<void> {
  requireRole(actor, 'guest');
  const style = await styleOf(tx, actor.cellarId, query.units);
  await writeCsv(out, journalColumns(style), journalPages(tx, actor.cellarId, query.batchId), { bom: query.bom });
}

/** Readings as the batch shows them, corrections applied. */
export async function exportReadings(actor: Actor, tx: EntityManager, query: JournalExport, out: Writable): Promise<void> {
  requireRole(actor, 'guest');
  const style = await styleOf(tx, actor.cellarId, query.units);
  await writeCsv(out, readingColumns(style), readingPages(tx, actor.cellarId, query.batchId), { bom: query.bom });
}
