/** Our plain mail design: one column, the app's green heading, a button, small print. */

const BRAND = '#2f5d50';

/** Escapes text for HTML: every value a person typed goes through this. */
export function escapeHtml(value: string): string {
  return value.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

export interface MailBody {
  /** First line, as a heading. */
  heading: string;
  /** Paragraphs of plain text. */
  paragraphs: string[];
  /** The one thing to do. */
  action?: { label: string; url: string };
  /** Small print under a rule (why you got this, how to stop it). */
  footer: string[];
}

/** The text body: what a plain-text mail client shows, links written out. */
export function renderText(body: MailBody): string {
  const lines = [body.heading, '', ...body.paragraphs.flatMap((p) => [p, ''])];
  if (body.action) lines.push(`${body.action.label}: ${body.action.url}`, '');
  lines.push('--', ...body.footer);
  return `${lines.join('\n')}\n`;
}

/** The HTML body: the same words, inline styles only (mail clients drop style sheets). */
export function renderHtml(body: MailBody): string {
  const p = (text: string) => `<p style="margin:0 0 14px;line-height:1.5">${escapeHtml(text)}</p>`;
  const button = body.action
    ? `<p style="margin:20px 0"><a href="${escapeHtml(body.action.url)}" style="background:${BRAND};color:#ffffff;padding:10px 18px;border-radius:6px;text-decoration:none;display:inline-block">${escapeHtml(body.action.label)}</a></p>` +
      `<p style="margin:0 0 14px;font-size:13px;color:#555555">Or open this link: <a href="${escapeHtml(body.action.url)}" style="color:${BRAND}">${escapeHtml(body.action.url)}</a></p>`
    : '';
  const footer = body.footer.map((f) => `<p style="margin:0 0 6px;font-size:12px;color:#666666">${escapeHtml(f)}</p>`).join('');
  return [
    '<!doctype html><html><body style="margin:0;padding:0;background:#f4f1ea">',
    '<div style="max-width:560px;margin:0 auto;padding:24px 16px;font-family:Helvetica,Arial,sans-serif;color:#1f2a24">',
    `<h1 style="margin:0 0 16px;font-size:20px;color:${BRAND}">${escapeHtml(body.heading)}</h1>`,
    body.paragraphs.map(p).join(''),
    button,
    '<hr style="border:none;border-top:1px solid #d8d2c4;margin:24px 0 12px">',
    footer,
    '</div></body></html>',
  ].join('');
}
