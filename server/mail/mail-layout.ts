import { brandColours } from '../../shared/palette';

/** Our plain mail design, in the app's colours: one column, a heading, a list or a button, small print. */

const HEADING = brandColours.primary;
/** Actions are honey in the app; white on it keeps 4.5 : 1. */
const ACTION = brandColours.secondary;

/** Escapes text for HTML: every value a person typed goes through this. */
export function escapeHtml(value: string): string {
  return value.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

export interface MailBody {
  /** First line, as a heading. */
  heading: string;
  /** Paragraphs of plain text. */
  paragraphs: string[];
  /** Things to look at, each with its own link (the tasks of a digest), after the paragraphs. */
  items?: MailItem[];
  /** The one thing to do. */
  action?: { label: string; url: string };
  /** Small print under a rule (why you got this, how to stop it). */
  footer: string[];
  /** A link in the small print (how to stop these mails): a link in HTML, written out in text. */
  footerLink?: { label: string; url: string };
}

/** One thing in a mail's list: a linked title, what it concerns, and a line of detail. */
export interface MailItem {
  title: string;
  subject: string;
  detail: string;
  /** Shown in the warning colour (the words must say it too). */
  urgent: boolean;
  url: string;
}

/** The text body: what a plain-text mail client shows, links written out. */
export function renderText(body: MailBody): string {
  const lines = [body.heading, '', ...body.paragraphs.flatMap((p) => [p, ''])];
  for (const item of body.items ?? []) lines.push(`${item.title}: ${item.subject}`, item.detail, item.url, '');
  if (body.action) lines.push(`${body.action.label}: ${body.action.url}`, '');
  lines.push('--', ...body.footer);
  if (body.footerLink) lines.push(`${body.footerLink.label}: ${body.footerLink.url}`);
  return `${lines.join('\n')}\n`;
}

/** The HTML body: the same words, inline styles only (mail clients drop style sheets). */
export function renderHtml(body: MailBody): string {
  const p = (text: string) => `<p style="margin:0 0 14px;line-height:1.5">${escapeHtml(text)}</p>`;
  const items = body.items?.length ? `<ul style="margin:0 0 14px;padding:0;list-style:none">${body.items.map(renderItem).join('')}</ul>` : '';
  const button = body.action
    ? `<p style="margin:20px 0"><a href="${escapeHtml(body.action.url)}" style="background:${ACTION};color:#ffffff;padding:10px 18px;border-radius:6px;text-decoration:none;display:inline-block">${escapeHtml(body.action.label)}</a></p>` +
      `<p style="margin:0 0 14px;font-size:13px;color:#555555">Or open this link: <a href="${escapeHtml(body.action.url)}" style="color:${HEADING}">${escapeHtml(body.action.url)}</a></p>`
    : '';
  const small = (html: string) => `<p style="margin:0 0 6px;font-size:12px;color:#666666">${html}</p>`;
  const footer =
    body.footer.map((f) => small(escapeHtml(f))).join('') +
    (body.footerLink ? small(`<a href="${escapeHtml(body.footerLink.url)}" style="color:#666666">${escapeHtml(body.footerLink.label)}</a>`) : '');
  return [
    // The language and title let a screen reader in a mail client read it as English, under its heading.
    `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width,initial-scale=1"><title>${escapeHtml(body.heading)}</title></head>`,
    '<body style="margin:0;padding:0;background:#f5f2ec">',
    '<div style="max-width:560px;margin:0 auto;padding:24px 16px;font-family:Helvetica,Arial,sans-serif;color:#232134">',
    `<h1 style="margin:0 0 16px;font-size:20px;color:${HEADING}">${escapeHtml(body.heading)}</h1>`,
    body.paragraphs.map(p).join(''),
    items,
    button,
    '<hr style="border:none;border-top:1px solid #d8d2c4;margin:24px 0 12px">',
    footer,
    '</div></body></html>',
  ].join('');
}

/** One list entry: the title is the link, so a long address never fills a phone's screen. */
function renderItem(item: MailItem): string {
  const detailColour = item.urgent ? brandColours.negative : '#55536a';
  return (
    `<li style="margin:0 0 10px;padding:10px 12px;background:#ffffff;border-radius:6px;line-height:1.45">` +
    `<a href="${escapeHtml(item.url)}" style="color:${HEADING};font-weight:bold">${escapeHtml(item.title)}</a><br>` +
    `${escapeHtml(item.subject)}<br>` +
    `<span style="font-size:13px;color:${detailColour}">${escapeHtml(item.detail)}</span></li>`
  );
}
