import { DELIMITERS } from '../../shared/schemas/exchange';

type Delimiter = (typeof DELIMITERS)[number];

/** How many times `ch` occurs outside double quotes in `line`. */
function countOutsideQuotes(line: string, ch: string): number {
  let inQuotes = false;
  let n = 0;
  for (const c of line) {
    if (c === '"') inQuotes = !inQuotes;
    else if (c === ch && !inQuotes) n++;
  }
  return n;
}

/**
 * The delimiter of a CSV sample: the one that splits the first lines into the same number of
 * cells, more than one, most often (a comma-decimal file usually uses `;`, so a comma that
 * splits lines unevenly loses to it).
 */
export function sniffDelimiter(sample: string): Delimiter {
  const lines = sample
    .split(/\r?\n/)
    .filter((l) => l.trim())
    .slice(0, 20);
  // The last line of a sample may be cut short.
  const whole = lines.length > 2 ? lines.slice(0, -1) : lines;
  let best: { delimiter: Delimiter; score: number } = { delimiter: ',', score: 0 };
  for (const delimiter of DELIMITERS) {
    const counts = whole.map((l) => countOutsideQuotes(l, delimiter));
    const steady = counts.every((c) => c === counts[0]);
    const score = counts[0] > 0 ? (steady ? 1000 : 0) + counts[0] : 0;
    if (score > best.score) best = { delimiter, score };
  }
  return best.delimiter;
}
