import { LINE_HEIGHT } from './template-schema';

/** Width of a text at a font size of 1 pt (widths grow linearly with the size). */
export type Measure = (text: string) => number;

/** Text laid out in a box: the lines to draw, their size and their measured widths (pt). */
export interface FittedText {
  size: number;
  lines: string[];
  widths: number[];
  lineHeight: number;
  /** Wrapped onto more than one line. */
  wrapped: boolean;
  /** Cut short with "…". */
  truncated: boolean;
}

export const ELLIPSIS = '…';
/** Font sizes are chosen in steps of this many points. */
const STEP = 0.25;
const EPS = 1e-9;

/**
 * Fits a text into a box (in points): first the largest size from maxPt down to minPt at
 * which it fits on one line; failing that, wrapped at minPt onto as many lines as the box
 * holds; failing that, the last line is cut with "…". Every line's width is at most
 * box.w and all lines together at most box.h — nothing is ever drawn outside the box.
 * @param measure - width of a string at 1 pt in the font to be used
 */
export function fitText(text: string, box: { w: number; h: number }, maxPt: number, minPt: number, measure: Measure): FittedText {
  const clean = text.replace(/\s+/g, ' ').trim();
  // A box shorter than one line at minPt is refused by the template schema; stay safe anyway.
  const floor = Math.min(minPt, box.h / LINE_HEIGHT);
  if (!clean) return { size: maxPt, lines: [], widths: [], lineHeight: maxPt * LINE_HEIGHT, wrapped: false, truncated: false };

  const unit = measure(clean);
  const fitting = Math.min(maxPt, unit > 0 ? box.w / unit : maxPt, box.h / LINE_HEIGHT);
  const stepped = Math.floor(fitting / STEP + EPS) * STEP;
  if (stepped >= floor - EPS && stepped > 0) {
    return { size: stepped, lines: [clean], widths: [unit * stepped], lineHeight: stepped * LINE_HEIGHT, wrapped: false, truncated: false };
  }

  const size = floor;
  const limit = box.w / size;
  const maxLines = Math.max(1, Math.floor(box.h / (size * LINE_HEIGHT) + EPS));
  const all = wrapWords(clean, limit, measure);
  let lines = all;
  let truncated = false;
  if (all.length > maxLines) {
    const rest = all.slice(maxLines - 1).join(' ');
    lines = [...all.slice(0, maxLines - 1), cutToFit(rest, limit, measure, true)];
    truncated = true;
  }
  return {
    size,
    lines,
    widths: lines.map((l) => measure(l) * size),
    lineHeight: size * LINE_HEIGHT,
    wrapped: lines.length > 1,
    truncated,
  };
}

/**
 * The words to wrap, with a lone middle dot ("Case 1 · 12 × 750 mL") kept on the word before it: a
 * line may end with a dot, never start with one, as on every screen.
 */
function wordsKeepingDots(text: string): string[] {
  const words: string[] = [];
  for (const word of text.split(' ')) {
    if (word === '·' && words.length) words[words.length - 1] += ' ·';
    else words.push(word);
  }
  return words;
}

/** Greedy word wrap to `limit` (in 1-pt units); a word too long for a line is split. */
export function wrapWords(text: string, limit: number, measure: Measure): string[] {
  const lines: string[] = [];
  let line = '';
  for (const word of wordsKeepingDots(text)) {
    const candidate = line ? `${line} ${word}` : word;
    if (measure(candidate) <= limit + EPS) {
      line = candidate;
      continue;
    }
    if (line) lines.push(line);
    line = word;
    // A single word wider than the box: break it where it must.
    while (measure(line) > limit + EPS) {
      const head = cutToFit(line, limit, measure, false);
      if (!head) {
        line = ''; // not even one character fits: draw nothing rather than overflow
        break;
      }
      lines.push(head);
      line = line.slice(head.length);
    }
  }
  if (line) lines.push(line);
  return lines;
}

/**
 * The longest start of `text` that fits `limit` (1-pt units), with "…" appended when
 * `ellipsis` is set and anything was cut. Found by bisection over the length.
 */
export function cutToFit(text: string, limit: number, measure: Measure, ellipsis: boolean): string {
  if (measure(text) <= limit + EPS) return text;
  const suffix = ellipsis ? ELLIPSIS : '';
  let lo = 0;
  let hi = text.length;
  while (lo < hi) {
    const mid = Math.ceil((lo + hi) / 2);
    if (measure(text.slice(0, mid).trimEnd() + suffix) <= limit + EPS) lo = mid;
    else hi = mid - 1;
  }
  const head = text.slice(0, lo).trimEnd();
  if (!ellipsis) return head;
  return measure(head + suffix) <= limit + EPS ? head + suffix : '';
}
