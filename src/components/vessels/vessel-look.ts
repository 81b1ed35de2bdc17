import type { VesselState } from '@shared/schemas/vessels';
import { VESSEL_KINDS, VESSEL_MATERIALS } from '@shared/schemas/vessels';

export interface StateLook {
  label: string;
  /** Background of badges and map tiles. */
  colour: string;
  icon: string;
}

/**
 * Cellarwright's own look for each vessel state: a colour readable with white text under
 * dim light, and an icon so the state never relies on colour alone.
 */
export const STATE_LOOK: Record<VesselState, StateLook> = {
  holding: { label: 'Holding a batch', colour: '#5b3a8c', icon: 'water_drop' },
  dirty: { label: 'Dirty', colour: '#94552b', icon: 'grain' },
  clean: { label: 'Clean', colour: '#2f6b80', icon: 'check_circle_outline' },
  sanitised: { label: 'Sanitised', colour: '#2e7d4f', icon: 'verified' },
  retired: { label: 'Retired', colour: '#6f6c7d', icon: 'do_not_disturb_on' },
};

/** The look of a bottle case on the map (occupants that are not vessels). */
export const CASE_LOOK: StateLook = { label: 'Bottle case', colour: '#8a3d55', icon: 'wine_bar' };

/** The look of any occupant state string the map receives. */
export function lookOf(state: string, isCase = false): StateLook {
  if (isCase) return CASE_LOOK;
  return STATE_LOOK[state as VesselState] ?? { label: state, colour: '#6f6c7d', icon: 'help_outline' };
}

export const KIND_LABELS: Record<(typeof VESSEL_KINDS)[number], string> = {
  carboy: 'Carboy',
  demijohn: 'Demijohn',
  jug: 'Jug',
  bucket: 'Bucket',
  keg: 'Keg',
  barrel: 'Barrel',
  tank: 'Tank',
  other: 'Other',
};

export const MATERIAL_LABELS: Record<(typeof VESSEL_MATERIALS)[number], string> = {
  glass: 'Glass',
  plastic: 'Plastic',
  stainless: 'Stainless steel',
  oak: 'Oak',
  ceramic: 'Ceramic',
  other: 'Other',
};

export const kindOptions = VESSEL_KINDS.map((value) => ({ value, label: KIND_LABELS[value] }));
export const materialOptions = VESSEL_MATERIALS.map((value) => ({ value, label: MATERIAL_LABELS[value] }));
