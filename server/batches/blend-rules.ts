import { gravityPoints } from '../../shared/calc';

/**
 * The blend's original gravity: the volume-weighted mean of its parents' OG in gravity points
 * (shared/calc gravityPoints); unknown when any parent's OG is unknown.
 */
export function blendedOg(shares: { og: number | null; volumeL: number }[]): number | null {
  if (shares.some((s) => s.og === null)) return null;
  const totalL = shares.reduce((sum, s) => sum + s.volumeL, 0);
  const points = shares.reduce((sum, s) => sum + gravityPoints(s.og as number) * s.volumeL, 0) / totalL;
  return Number((1 + points / 1000).toFixed(3));
}

/** "Blend of Heather mead, Quince cyser and Sloe wine", cut to the column's 80 characters. */
export function blendYeastName(names: string[]): string {
  const list = names.length > 1 ? `${names.slice(0, -1).join(', ')} and ${names.at(-1)}` : names.join('');
  const text = `Blend of ${list}`;
  return text.length <= 80 ? text : `${text.slice(0, 79)}…`;
}
