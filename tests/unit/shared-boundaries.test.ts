import fs from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { sourceFiles } from './source-files';

const root = path.resolve(import.meta.dirname, '../../shared');

const importsOf = (file: string) => [...fs.readFileSync(file, 'utf8').matchAll(/from\s+'([^']+)'/g)].map((m) => m[1]!);

describe('shared/ is used by both sides and depends on neither', () => {
  const files = sourceFiles(root, ['.ts']);

  it('finds the shared sources', () => {
    expect(files.some((f) => f.endsWith(path.join('calc', 'index.ts')))).toBe(true);
  });

  it.each(files.map((f) => [path.relative(root, f), f]))('%s imports nothing from server/ or src/', (_name, file) => {
    for (const spec of importsOf(file)) {
      const resolved = spec.startsWith('.') ? path.resolve(path.dirname(file), spec) : spec;
      expect(spec.startsWith('@/')).toBe(false);
      if (spec.startsWith('.')) expect(resolved.startsWith(root)).toBe(true);
    }
  });

  it('keeps shared/calc free of packages (pure arithmetic)', () => {
    for (const file of files.filter((f) => f.includes(`${path.sep}calc${path.sep}`))) {
      for (const spec of importsOf(file)) expect(spec.startsWith('.')).toBe(true);
    }
  });
});
