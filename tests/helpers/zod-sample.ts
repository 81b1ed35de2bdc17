import type { ZodType } from 'zod';

/** What a sample needs from outside the schema: ids to put where a UUID goes, a label code. */
export interface SampleContext {
  /** An id for a field (the field's name helps pick a batch id for `batchId`, and so on). */
  idFor(field: string): string;
  labelCode: string;
}

type Def = {
  type: string;
  format?: string;
  coerce?: boolean;
  checks?: { _zod: { def: Record<string, unknown> } }[];
  shape?: Record<string, ZodType>;
  element?: ZodType;
  options?: ZodType[];
  innerType?: ZodType;
  in?: ZodType;
  out?: ZodType;
  entries?: Record<string, string>;
  values?: unknown[];
  valueType?: ZodType;
  defaultValue?: unknown;
};

const defOf = (schema: ZodType) => (schema as unknown as { _zod: { def: Def } })._zod.def;
const checksOf = (def: Def) => (def.checks ?? []).map((c) => c._zod.def);

/**
 * A plausible valid value for a zod schema (objects with every field, the smallest allowed
 * numbers above zero, today's date), so a test can send a request a route would accept and
 * then spoil one field of it. Not a general generator: it covers the kinds our schemas use.
 */
export function sampleOf(schema: ZodType, ctx: SampleContext, field = ''): unknown {
  const def = defOf(schema);
  switch (def.type) {
    case 'object':
      return Object.fromEntries(Object.entries(def.shape ?? {}).map(([key, inner]) => [key, sampleOf(inner, ctx, key)]));
    case 'string':
      return sampleString(def, ctx, field);
    case 'number': {
      const checks = checksOf(def);
      const low = checks.find((c) => c.check === 'greater_than');
      const high = checks.find((c) => c.check === 'less_than');
      let value = low ? Number(low.value) + (low.inclusive ? 0 : 1) : 1;
      if (value <= 0 && !low) value = 1;
      if (high && value > Number(high.value)) value = Number(high.value);
      return checks.some((c) => c.check === 'number_format') ? Math.ceil(value) : value;
    }
    case 'boolean':
      return false;
    case 'enum':
      return Object.values(def.entries ?? {})[0];
    case 'literal':
      return def.values?.[0];
    case 'array': {
      const min = checksOf(def).find((c) => c.check === 'min_length');
      return Array.from({ length: Math.max(1, Number(min?.minimum ?? 1)) }, () => sampleOf(def.element as ZodType, ctx, field));
    }
    case 'union':
      return sampleOf((def.options ?? [])[0] as ZodType, ctx, field);
    case 'nullable':
    case 'optional':
    case 'readonly':
    case 'catch':
    case 'nonoptional':
      return sampleOf(def.innerType as ZodType, ctx, field);
    case 'default':
    case 'prefault':
      return sampleOf(def.innerType as ZodType, ctx, field);
    case 'pipe':
      return sampleOf(def.in as ZodType, ctx, field);
    case 'record':
      return {};
    default:
      return undefined;
  }
}

function sampleString(def: Def, ctx: SampleContext, field: string): string {
  if (def.format === 'uuid' || def.format === 'guid') return ctx.idFor(field);
  if (def.format === 'date') return new Date().toISOString().slice(0, 10);
  if (def.format === 'datetime') return new Date().toISOString();
  if (def.format === 'email') return 'someone@example.test';
  const checks = checksOf(def);
  if (checks.some((c) => c.format === 'regex')) return ctx.labelCode;
  const min = Number(checks.find((c) => c.check === 'min_length')?.minimum ?? 0);
  const max = Number(checks.find((c) => c.check === 'max_length')?.maximum ?? 40);
  const text = `Sample ${field || 'text'} words`.padEnd(min, 'x');
  return text.slice(0, Math.max(min, Math.min(max, text.length)));
}

/** Every path to a leaf field of a sample (objects and arrays walked), for spoiling one field at a time. */
export function leafPaths(value: unknown, prefix: string[] = []): string[][] {
  if (Array.isArray(value)) return value.length === 0 ? [prefix] : [prefix, ...value.flatMap((item, i) => leafPaths(item, [...prefix, String(i)]))];
  if (value !== null && typeof value === 'object') {
    const entries = Object.entries(value);
    return entries.length === 0 ? [prefix] : entries.flatMap(([key, item]) => leafPaths(item, [...prefix, key]));
  }
  return [prefix];
}

/** A deep copy of `value` with the field at `path` replaced. */
export function withField(value: unknown, path: string[], replacement: unknown): unknown {
  if (path.length === 0) return replacement;
  const copy: Record<string, unknown> | unknown[] = Array.isArray(value) ? [...value] : { ...(value as Record<string, unknown>) };
  const [head, ...rest] = path;
  (copy as Record<string, unknown>)[head] = withField((copy as Record<string, unknown>)[head], rest, replacement);
  return copy;
}
