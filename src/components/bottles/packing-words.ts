import { casesFrom } from '@shared/calc';

const SMALL = ['no', 'one', 'two', 'three', 'four', 'five', 'six', 'seven', 'eight', 'nine', 'ten'];
/** "one", "two" … "ten", then digits. */
const countWord = (n: number) => SMALL[n] ?? String(n);

/**
 * A bottling's packing in plain words: "14 bottles: one full case of 12 and a part case of 2",
 * "24 bottles: two full cases of 12", "5 bottles: a part case of 5".
 * @param bottles - bottles filled (a whole number, at least 1)
 * @param perCase - bottles a full case holds
 */
export function packingSummary(bottles: number, perCase: number): string {
  const { cases, loose } = casesFrom(bottles, perCase);
  const parts: string[] = [];
  if (cases > 0) parts.push(`${countWord(cases)} full ${cases === 1 ? 'case' : 'cases'} of ${perCase}`);
  if (loose > 0) parts.push(`a part case of ${loose}`);
  return `${bottles} ${bottles === 1 ? 'bottle' : 'bottles'}: ${parts.join(' and ')}`;
}
