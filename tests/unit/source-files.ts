import fs from 'node:fs';
import path from 'node:path';

/**
 * Every file below `dir` whose name ends in one of `extensions` (".ts", ".vue"), for tests that read
 * the code itself. It sits beside the unit tests, not in tests/helpers: the mutation run copies only
 * tests/unit and tests/calc into its sandbox.
 */
export function sourceFiles(dir: string, extensions: readonly string[]): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const full = path.join(dir, e.name);
    if (e.isDirectory()) return sourceFiles(full, extensions);
    return extensions.some((ext) => e.name.endsWith(ext)) ? [full] : [];
  });
}
