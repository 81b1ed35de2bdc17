import { MONTH_ABBREVIATIONS } from '@shared/date-words';

/**
 * The date styles a user can choose, and the pure conversions between a calendar date
 * (YYYY-MM-DD, as the API carries it) and the way it is shown and typed in that style.
 */
export const DATE_STYLES = ['d-mmm-yyyy', 'dd/mm/yyyy', 'mm/dd/yyyy', 'yyyy-mm-dd'] as const;
export type DateStyle = (typeof DATE_STYLES)[number];
export const DEFAULT_DATE_STYLE: DateStyle = 'd-mmm-yyyy';

/** How each style looks, for the chooser: 2 December 2026 written in it. */
export const DATE_STYLE_EXAMPLES: Record<DateStyle, string> = {
  'd-mmm-yyyy': '2 Dec 2026',
  'dd/mm/yyyy': '02/12/2026',
  'mm/dd/yyyy': '12/02/2026',
  'yyyy-mm-dd': '2026-12-02',
};

/**
 * What an empty date field shows in each style: the pattern, never a date, which in a field
 * for a day to come (a take-out date) would read like a day gone by.
 */
export const DATE_STYLE_PLACEHOLDERS: Record<DateStyle, string> = {
  'd-mmm-yyyy': 'd mmm yyyy',
  'dd/mm/yyyy': 'dd/mm/yyyy',
  'mm/dd/yyyy': 'mm/dd/yyyy',
  'yyyy-mm-dd': 'yyyy-mm-dd',
};

/** The mask Quasar's QDate uses to read and write its model in each style. */
export const QDATE_MASKS: Record<DateStyle, string> = {
  'd-mmm-yyyy': 'D MMM YYYY',
  'dd/mm/yyyy': 'DD/MM/YYYY',
  'mm/dd/yyyy': 'MM/DD/YYYY',
  'yyyy-mm-dd': 'YYYY-MM-DD',
};

const pad = (n: number) => String(n).padStart(2, '0');

/** Year, month (1–12) and day of a real calendar date, or null. */
function realDate(y: number, m: number, d: number): [number, number, number] | null {
  if (!Number.isInteger(y) || !Number.isInteger(m) || !Number.isInteger(d) || m < 1 || m > 12 || d < 1) return null;
  const last = new Date(Date.UTC(y, m, 0)).getUTCDate();
  return d <= last ? [y, m, d] : null;
}

/** The calendar date of a YYYY-MM-DD string or a Date (its local day), or null. */
function partsOf(value: string | Date): [number, number, number] | null {
  if (value instanceof Date) return Number.isNaN(value.getTime()) ? null : [value.getFullYear(), value.getMonth() + 1, value.getDate()];
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(value);
  return m ? realDate(Number(m[1]), Number(m[2]), Number(m[3])) : null;
}

/**
 * A calendar date written in a style: "2 Dec 2026", "02/12/2026", "12/02/2026" or "2026-12-02".
 * @param value - YYYY-MM-DD, or a Date (its local calendar day)
 * @returns the date in the style, or the value unchanged when it is not a date
 */
export function formatDateInStyle(value: string | Date, style: DateStyle): string {
  const parts = partsOf(value);
  if (!parts) return String(value);
  const [y, m, d] = parts;
  switch (style) {
    case 'dd/mm/yyyy':
      return `${pad(d)}/${pad(m)}/${y}`;
    case 'mm/dd/yyyy':
      return `${pad(m)}/${pad(d)}/${y}`;
    case 'yyyy-mm-dd':
      return `${y}-${pad(m)}-${pad(d)}`;
    default:
      return `${d} ${MONTH_ABBREVIATIONS[m - 1]} ${y}`;
  }
}

/**
 * A date typed in a style, as YYYY-MM-DD; null when it is not a real date written that way.
 * The month-name style also takes full month names and any case ("2 december 2026").
 */
export function parseDateInStyle(text: string, style: DateStyle): string | null {
  const t = text.trim();
  let parts: [number, number, number] | null = null;
  if (style === 'd-mmm-yyyy') {
    const m = /^(\d{1,2})\s+([A-Za-z]{3,9})\.?\s+(\d{4})$/.exec(t);
    const month = m ? MONTH_ABBREVIATIONS.findIndex((name) => m[2].toLowerCase().startsWith(name.toLowerCase())) + 1 : 0;
    parts = m && month > 0 ? realDate(Number(m[3]), month, Number(m[1])) : null;
  } else if (style === 'yyyy-mm-dd') {
    const m = /^(\d{4})-(\d{1,2})-(\d{1,2})$/.exec(t);
    parts = m ? realDate(Number(m[1]), Number(m[2]), Number(m[3])) : null;
  } else {
    const m = /^(\d{1,2})\/(\d{1,2})\/(\d{4})$/.exec(t);
    if (m) parts = style === 'dd/mm/yyyy' ? realDate(Number(m[3]), Number(m[2]), Number(m[1])) : realDate(Number(m[3]), Number(m[1]), Number(m[2]));
  }
  return parts ? `${parts[0]}-${pad(parts[1])}-${pad(parts[2])}` : null;
}

/**
 * A message with every YYYY-MM-DD date in it rewritten in the style, so a server's message
 * reads the way the user reads dates everywhere else. Timestamps keep only their date.
 */
export function datesInStyle(message: string, style: DateStyle): string {
  return message.replace(/\b(\d{4}-\d{2}-\d{2})(?:T[\d:.]+(?:Z|[+-]\d{2}:?\d{2})?)?\b/g, (whole, date: string) => {
    const shown = formatDateInStyle(date, style);
    return shown === date && style !== 'yyyy-mm-dd' ? whole : shown;
  });
}
