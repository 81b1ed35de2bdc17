import { ZodError } from 'zod';
import {
  CONTROL_CHARACTER_MESSAGE,
  hasControlCharacter,
  hasNoteControlCharacter,
  MULTILINE_FIELDS,
  NOTE_CONTROL_CHARACTER_MESSAGE,
} from '../../shared/schemas/text-rules';

/** Keys that would reach an object's prototype if code ever merged input into an object. */
const PROTOTYPE_KEYS = new Set(['__proto__', 'constructor', 'prototype']);
const MAX_DEPTH = 20;

interface Issue {
  path: string;
  message: string;
}

/** The first thing wrong with a decoded value, walking objects and arrays; `field` is the nearest key. */
function findIssue(value: unknown, path: string[], field: string, depth: number): Issue | null {
  const at = () => path.join('.');
  if (typeof value === 'string') {
    if (MULTILINE_FIELDS.has(field)) {
      return hasNoteControlCharacter(value) ? { path: at(), message: NOTE_CONTROL_CHARACTER_MESSAGE } : null;
    }
    return hasControlCharacter(value) ? { path: at(), message: CONTROL_CHARACTER_MESSAGE } : null;
  }
  if (value === null || typeof value !== 'object') return null;
  if (depth > MAX_DEPTH) return { path: at(), message: 'nested too deeply' };
  const entries = Array.isArray(value) ? value.map((item, i) => [String(i), item] as const) : Object.entries(value);
  for (const [key, item] of entries) {
    if (PROTOTYPE_KEYS.has(key)) return { path: [...path, key].join('.'), message: 'this name is not allowed as a field' };
    const issue = findIssue(item, [...path, key], Array.isArray(value) ? field : key, depth + 1);
    if (issue) return issue;
  }
  return null;
}

/**
 * Refuses a request whose decoded body, query or path parameters hold a control character
 * where none belongs (NUL always; tab and line breaks outside notes) or a prototype-reaching
 * key, before any schema or service sees it. Throws the same 400 a schema refusal gives,
 * naming the field. `handle` calls it for every route, after any form parser has run.
 */
export function guardInput(parts: Record<'params' | 'query' | 'body', unknown>): void {
  for (const [source, value] of Object.entries(parts)) {
    const issue = findIssue(value, [source], '', 0);
    if (issue) {
      const error = new ZodError([{ code: 'custom', path: issue.path.split('.').slice(1), message: issue.message, input: undefined }]);
      throw Object.assign(error, { source });
    }
  }
}
