/**
 * Reading a gravity as people type it: "1.110", "1,110", or in points — "1110" or "1110.5",
 * the way a hydrometer's scale is often read aloud — which is taken as 1.110 (1.1105) and said
 * so, instead of being refused as out of range.
 */
import { GRAVITY_MAX, GRAVITY_MIN } from './guards';

/** A typed gravity as read, with a note when it was taken as points. */
export interface TypedGravity {
  /** The specific gravity (out of range when the text was neither SG nor points; the form's check says so). */
  sg: number;
  /** "read as 1.110" when the text was in points; null otherwise. */
  note: string | null;
}

/** Thousandths: 1110 points of SG is 1.110. */
const POINTS_PER_SG = 1000;

/**
 * The specific gravity a typed text means; null when nothing (or no number) was typed.
 * @param text - what was typed: a number or its text (comma or point as the decimal mark)
 */
export function readTypedGravity(text: string | number | null | undefined): TypedGravity | null {
  if (text === null || text === undefined) return null;
  const raw = typeof text === 'number' ? text : Number(text.replace(',', '.'));
  if ((typeof text === 'string' && text.trim() === '') || !Number.isFinite(raw)) return null;
  if (raw >= GRAVITY_MIN * POINTS_PER_SG && raw <= GRAVITY_MAX * POINTS_PER_SG) {
    const sg = raw / POINTS_PER_SG;
    const decimals = Number.isInteger(raw) ? 3 : Math.min(6, 3 + String(raw).split('.')[1]!.length);
    return { sg, note: `read as ${sg.toFixed(decimals)}` };
  }
  return { sg: raw, note: null };
}
