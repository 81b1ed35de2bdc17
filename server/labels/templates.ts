import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { LabelTemplateSummary } from '../../shared/schemas/labels';
import { labelsPerPage } from './layout';
import { labelTemplateSchema, type LabelTemplate } from './template-schema';

/** The repository's labels/ folder: one JSON file per template. */
export const LABELS_DIR = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../labels');

/** A template file that cannot be used; the message names the file and every problem. */
export class LabelTemplateError extends Error {}

/**
 * Reads and validates every labels/*.json. Throws LabelTemplateError on the first bad file
 * (bad JSON, a schema problem, an id that is not the file name, a duplicate): a broken
 * template stops the app at start-up rather than printing a broken sheet later.
 * @param dir - folder to read, labels/ by default
 */
export function loadTemplates(dir: string = LABELS_DIR): LabelTemplate[] {
  const files = fs
    .readdirSync(dir)
    .filter((f) => f.endsWith('.json'))
    .sort();
  if (files.length === 0) throw new LabelTemplateError(`No label templates (*.json) in ${dir}.`);
  const seen = new Set<string>();
  return files.map((file) => {
    const where = path.join(dir, file);
    let raw: unknown;
    try {
      raw = JSON.parse(fs.readFileSync(where, 'utf8'));
    } catch (err) {
      throw new LabelTemplateError(`Label template ${where} is not valid JSON: ${(err as Error).message}`);
    }
    const parsed = labelTemplateSchema.safeParse(raw);
    if (!parsed.success) {
      const lines = parsed.error.issues.map((i) => `  ${i.path.join('.') || '(file)'}: ${i.message}`);
      throw new LabelTemplateError(`Label template ${where} is invalid:\n${lines.join('\n')}`);
    }
    const template = parsed.data;
    if (`${template.id}.json` !== file) {
      throw new LabelTemplateError(`Label template ${where}: its id "${template.id}" must match the file name.`);
    }
    if (seen.has(template.id)) throw new LabelTemplateError(`Label template id "${template.id}" is used twice.`);
    seen.add(template.id);
    return template;
  });
}

let cached: Map<string, LabelTemplate> | undefined;

/** Every template by id, loaded once per process. */
export function labelTemplates(): Map<string, LabelTemplate> {
  cached ??= new Map(loadTemplates().map((t) => [t.id, t]));
  return cached;
}

/** What the API lists about a template. */
export function templateSummary(t: LabelTemplate): LabelTemplateSummary {
  return {
    id: t.id,
    name: t.name,
    description: t.description,
    kind: t.kind,
    pageSize: { widthMm: t.page.width, heightMm: t.page.height },
    labelSize: { widthMm: t.label.width, heightMm: t.label.height },
    grid: { columns: t.grid.columns, rows: t.grid.rows },
    labelsPerPage: labelsPerPage(t),
  };
}
