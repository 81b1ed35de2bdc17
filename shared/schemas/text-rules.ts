import { z } from 'zod';

/**
 * Control characters in text people type. NUL is never stored (PostgreSQL refuses it in text);
 * the other C0 controls, DEL and the C1 controls have no place in a name or a note. Tab, line
 * feed and carriage return are allowed only in free text that can span lines (notes).
 */
// eslint-disable-next-line no-control-regex
const ANY_CONTROL = /[\u0000-\u001f\u007f-\u009f]/;
// eslint-disable-next-line no-control-regex
const CONTROL_EXCEPT_LINES = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f-\u009f]/;

export const CONTROL_CHARACTER_MESSAGE = 'remove the control characters (such as tabs or invisible characters) from this text';
export const NOTE_CONTROL_CHARACTER_MESSAGE = 'remove the invisible control characters from this text';

/** True when a one-line text (a name, a code, a search) holds a control character. */
export function hasControlCharacter(text: string): boolean {
  return ANY_CONTROL.test(text);
}

/** True when a multi-line text (a note) holds a control character other than tab and line breaks. */
export function hasNoteControlCharacter(text: string): boolean {
  return CONTROL_EXCEPT_LINES.test(text);
}

/**
 * Field names whose text may span lines (tabs and line breaks allowed). Everything else is
 * one line. The server's input guard reads this list; keep it to free-text fields.
 */
export const MULTILINE_FIELDS: ReadonlySet<string> = new Set(['notes', 'note', 'text', 'appearance', 'aroma', 'flavour', 'reason']);

/** A one-line text: no control characters at all. */
export const lineText = () => z.string().refine((text) => !hasControlCharacter(text), CONTROL_CHARACTER_MESSAGE);
/** Free text that may span lines: tab and line breaks allowed, other control characters not. */
export const noteText = () => z.string().refine((text) => !hasNoteControlCharacter(text), NOTE_CONTROL_CHARACTER_MESSAGE);
