import fs from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { sourceFiles } from './source-files';

/**
 * The client separates short facts with a middle dot ("Carboy 3 · 23 L"). Where the line wraps, the
 * dot belongs at the end of a line, never at the start of the next one: so the space before it is a
 * no-break space (`&nbsp;` in a template, `\u00a0` in code). An ordinary space, a line break in a
 * template (Vue condenses it to a space) or an element opened after one all let the browser break
 * right before the dot.
 */
const repo = path.resolve(import.meta.dirname, '../..');
/** The client's own files, and the shared code whose words it shows. */
const SCREEN_SOURCES = ['src', 'shared'];

/** Ordinary white space, then any opening span or template tags, then the dot (with or without a no-break space). */
const BREAKABLE_DOT = /\s(?:<(?:span|template)\b(?:"[^"]*"|'[^']*'|[^'">])*>\s*)*(?:&nbsp;|\\u00a0)?·/g;
const COMMENT_LINE = /^\s*(\/\/|\/\*|\*|<!--)/;

/** Each place in a source text where a line could start with a dot, as "line: text". */
function breakableDots(text: string): string[] {
  const lines = text.split('\n');
  return [...text.matchAll(BREAKABLE_DOT)].flatMap((m) => {
    const dotLine = text.slice(0, m.index + m[0].length).split('\n').length;
    const line = lines[dotLine - 1]!;
    return COMMENT_LINE.test(line) ? [] : [`${dotLine}: ${line.trim()}`];
  });
}

describe('a dot separator never starts a line', () => {
  it('finds what it is looking for', () => {
    expect(breakableDots('{{ a }} · {{ b }}')).toHaveLength(1);
    expect(breakableDots('{{ a }}\n  <span v-if="x > 1">\n    &nbsp;· {{ b }}</span>')).toHaveLength(1);
    expect(breakableDots('`${a} · ${b}`')).toHaveLength(1);
    expect(breakableDots('{{ a }}&nbsp;· {{ b }}')).toEqual([]);
    expect(breakableDots('{{ a }}<span v-if="x">&nbsp;· {{ b }}</span>')).toEqual([]);
    expect(breakableDots('`${a}\\u00a0· ${b}`')).toEqual([]);
    expect(breakableDots('/** "Rack A · shelf 2" */')).toEqual([]);
  });

  const files = SCREEN_SOURCES.flatMap((dir) => sourceFiles(path.join(repo, dir), ['.ts', '.vue']));

  it('reads the client and the shared code', () => {
    expect(files.some((f) => f.endsWith(path.join('src', 'components', 'vessels', 'VesselCard.vue')))).toBe(true);
    expect(files.some((f) => f.endsWith(path.join('shared', 'domain', 'tasting-scale.ts')))).toBe(true);
  });

  it.each(files.map((f) => [path.relative(repo, f), f]))('in %s', (_name, file) => {
    expect(breakableDots(fs.readFileSync(file, 'utf8'))).toEqual([]);
  });
});
