import fs from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { sourceFiles } from './source-files';

/**
 * Every date and time a screen shows goes through useFormat (the date style the user chose,
 * a 24-hour clock), never through the browser's language: a Keeper who chose "2 Dec 2026" saw
 * "Dec 5, 2026, 6:24 PM" in the local mailbox. So the client calls none of the browser's own
 * date formatters.
 */
const repo = path.resolve(import.meta.dirname, '../..');
const BROWSER_DATE_FORMAT = /\.toLocale(?:Date|Time)?String\(|Intl\.(?:DateTimeFormat|RelativeTimeFormat)\b/g;

/** Each line of a source text that formats a date in the browser's language, as "line: text". */
function browserDates(text: string): string[] {
  return text.split('\n').flatMap((line, i) => (line.match(BROWSER_DATE_FORMAT) ? [`${i + 1}: ${line.trim()}`] : []));
}

describe("dates on screen are in the user's date style, never the browser's", () => {
  it('finds what it is looking for', () => {
    expect(browserDates("new Date(iso).toLocaleString(undefined, { dateStyle: 'medium' })")).toHaveLength(1);
    expect(browserDates('d.toLocaleDateString()\nd.toLocaleTimeString()')).toHaveLength(2);
    expect(browserDates("new Intl.DateTimeFormat('en-GB').format(d)")).toHaveLength(1);
    expect(browserDates('fmt.dateTime(m.receivedAt)')).toEqual([]);
    expect(browserDates("Intl.supportedValuesOf('timeZone')")).toEqual([]);
  });

  const files = sourceFiles(path.join(repo, 'src'), ['.ts', '.vue']);

  it('reads the client', () => {
    expect(files.some((f) => f.endsWith(path.join('src', 'pages', 'OutgoingMailPage.vue')))).toBe(true);
  });

  it.each(files.map((f) => [path.relative(repo, f), f]))('in %s', (_name, file) => {
    expect(browserDates(fs.readFileSync(file, 'utf8'))).toEqual([]);
  });
});
