/**
 * When headspace is worth a warning. In primary a ferment needs room for its foam and its own
 * carbon dioxide blankets it, so headspace there is room, not risk (common practice); after the
 * first racking the gas is spent and air over the liquid oxidises it, so headspace above the
 * cellar's limit is warned about.
 * @param stage - the batch's stage; unknown (null) is judged as after primary
 */
export function headspaceIsRisk(stage: string | null | undefined): boolean {
  return stage !== 'primary';
}

/** What the screens say instead of a warning while the batch is in primary. */
export const HEADSPACE_IN_PRIMARY_NOTE =
  'In primary: room for the foam, and the ferment’s own gas protects it (common practice). Headspace matters after the first racking.';
