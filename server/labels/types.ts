import type { LabelKind } from '../../shared/schemas/labels';

/**
 * One label to print: which layout, the code its QR carries, and the texts the layout's
 * fields may show (an empty or missing text leaves its box blank).
 */
export interface LabelItem {
  kind: LabelKind;
  /** The thing's id (for tests and reports; not printed). */
  id: string;
  code: string;
  texts: Partial<Record<string, string>>;
}

/** What the renderer reports about each text it drew (pt, page coordinates). */
export interface TextReport {
  page: number;
  cell: number;
  field: string;
  box: { x: number; y: number; w: number; h: number };
  size: number;
  lines: string[];
  widths: number[];
  lineHeight: number;
  truncated: boolean;
}
