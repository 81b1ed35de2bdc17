import { vesselState } from '../../shared/domain/vessel-state';
import type { CleaningState, SlotRef, Vessel as VesselDto, VesselKind } from '../../shared/schemas/vessels';

/** One vessel as vessel-queries.ts reads it: its own columns, its batch's name and its cellar's lapse days. */
export interface VesselRow {
  id: string;
  code: string;
  name: string;
  kind: VesselKind;
  material: string;
  capacityL: number;
  cleaningState: CleaningState;
  sanitisedAt: Date | null;
  retiredAt: Date | null;
  batchId: string | null;
  volumeL: number | null;
  filledAt: Date | null;
  notes: string;
  version: number;
  batchName: string | null;
  batchKind: string | null;
  batchStage?: string | null;
  /** ISO date the batch it holds was started on. */
  batchStartedOn: string | null;
  /** The batch's original gravity, when taken. */
  batchOg?: number | null;
  sanitisedValidDays: number;
}

const iso = (d: Date | null) => (d ? d.toISOString() : null);

/**
 * The API's view of a vessel (`vesselSchema`).
 * @param place - its slot, from placesOf
 * @param now - the moment its state is judged at (the same one the query filtered with)
 */
export function toVesselDto(row: VesselRow, place: SlotRef | null, now: Date): VesselDto {
  return {
    id: row.id,
    code: row.code,
    name: row.name,
    kind: row.kind,
    material: row.material as VesselDto['material'],
    capacityL: row.capacityL,
    state: vesselState(row, row.sanitisedValidDays, now),
    sanitisedAt: iso(row.sanitisedAt),
    batch: row.batchId
      ? { id: row.batchId, name: row.batchName ?? '', kind: row.batchKind ?? '', ...(row.batchStage ? { stage: row.batchStage } : {}) }
      : null,
    volumeL: row.volumeL,
    filledAt: iso(row.filledAt),
    place,
    notes: row.notes,
    version: row.version,
  };
}
