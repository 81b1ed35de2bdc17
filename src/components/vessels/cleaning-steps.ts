import type { CleaningState, VesselState } from '@shared/schemas/vessels';

export interface CleaningStep {
  to: CleaningState;
  label: string;
  icon: string;
}

const MARK_DIRTY: CleaningStep = { to: 'dirty', label: 'Mark dirty', icon: 'grain' };
const MARK_CLEAN: CleaningStep = { to: 'clean', label: 'Mark clean', icon: 'check_circle_outline' };
const MARK_SANITISED: CleaningStep = { to: 'sanitised', label: 'Mark sanitised', icon: 'verified' };
const SANITISE_AGAIN: CleaningStep = { to: 'sanitised', label: 'Sanitise again', icon: 'verified' };

/**
 * The cleaning steps that make sense from each state. A dirty vessel is cleaned before it
 * is sanitised (the server refuses dirty → sanitised); a vessel holding a batch or retired
 * has none.
 */
export function cleaningStepsFrom(state: VesselState): CleaningStep[] {
  switch (state) {
    case 'dirty':
      return [MARK_CLEAN];
    case 'clean':
      return [MARK_SANITISED, MARK_DIRTY];
    case 'sanitised':
      return [SANITISE_AGAIN, MARK_DIRTY];
    default:
      return [];
  }
}
