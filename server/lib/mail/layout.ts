// Tightloop's own mail layout: one plain-text and one HTML rendering of the same content.
export type MailRow = { label: string; detail?: string; url?: string };
export type MailSection = { heading: string; rows: MailRow[]; more?: string };
export type MailContent = {
  /** First line of the mail, in both parts. */
  heading: string;
  paragraphs: string[];
  action?: { label: string; url: string };
  sections?: MailSection[];
  /** Small print: why the person gets this mail, how to stop it. */
  footer?: { text: string; url?: string; linkLabel?: string }[];
};

const esc = (s: string) =>
  s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&#39;');

const INK = '#0b161d';
const ACCENT = '#005264';
const MUTED = '#435762';
const PAPER = '#f3f4ee';
const RULE = '#cbd3d6';

export function renderMail(c: MailContent): { text: string; html: string } {
  const text: string[] = [c.heading, '', ...c.paragraphs.flatMap((p) => [p, ''])];
  if (c.action) text.push(`${c.action.label}: ${c.action.url}`, '');
  for (const s of c.sections ?? []) {
    text.push(s.heading, '-'.repeat(s.heading.length));
    for (const r of s.rows) text.push(`- ${r.label}${r.detail ? ` — ${r.detail}` : ''}${r.url ? `\n  ${r.url}` : ''}`);
    if (s.more) text.push(s.more);
    text.push('');
  }
  text.push('--', 'Tightloop · service history for reefer units');
  for (const f of c.footer ?? [])
    text.push(f.url ? `${f.text} ${f.linkLabel ?? ''}: ${f.url}`.replace(/ +:/, ':') : f.text);

  const p = (s: string) => `<p style="margin:0 0 14px;line-height:1.5">${esc(s)}</p>`;
  const link = (label: string, url: string) => `<a href="${esc(url)}" style="color:${ACCENT}">${esc(label)}</a>`;
  const sections = (c.sections ?? [])
    .map(
      (s) =>
        `<h2 style="font-size:15px;margin:22px 0 8px;color:${INK}">${esc(s.heading)}</h2>` +
        `<table role="presentation" style="border-collapse:collapse;width:100%">${s.rows
          .map(
            (r) =>
              `<tr><td style="padding:6px 0;border-top:1px solid ${RULE}">${r.url ? link(r.label, r.url) : esc(r.label)}</td>` +
              `<td style="padding:6px 0;border-top:1px solid ${RULE};color:${MUTED};text-align:right">${esc(r.detail ?? '')}</td></tr>`,
          )
          .join('')}</table>` +
        (s.more ? `<p style="margin:8px 0 0;color:${MUTED}">${esc(s.more)}</p>` : ''),
    )
    .join('');
  const action = c.action
    ? `<p style="margin:20px 0"><a href="${esc(c.action.url)}" style="display:inline-block;background:${ACCENT};color:#fff;` +
      `padding:12px 20px;border-radius:6px;text-decoration:none;font-weight:600">${esc(c.action.label)}</a></p>` +
      `<p style="margin:0 0 14px;color:${MUTED};font-size:13px">Or paste this address into your browser: ${esc(c.action.url)}</p>`
    : '';
  const footer = (c.footer ?? [])
    .map((f) => `<p style="margin:4px 0">${esc(f.text)}${f.url ? ` ${link(f.linkLabel ?? f.url, f.url)}` : ''}</p>`)
    .join('');
  const html =
    `<!doctype html><html><body style="margin:0;background:${PAPER};font-family:'Work Sans',Arial,sans-serif;color:${INK}">` +
    `<div style="max-width:560px;margin:0 auto;padding:24px 16px">` +
    `<div style="font-weight:700;letter-spacing:.04em;color:${ACCENT};margin-bottom:12px">TIGHTLOOP</div>` +
    `<div style="background:#fff;border-radius:8px;padding:24px;border-top:4px solid ${ACCENT}">` +
    `<h1 style="font-size:19px;margin:0 0 16px">${esc(c.heading)}</h1>` +
    c.paragraphs.map(p).join('') +
    action +
    sections +
    `</div><div style="font-size:12px;color:${MUTED};padding:12px 4px">` +
    `<p style="margin:4px 0">Tightloop · service history for reefer units</p>${footer}</div></div></body></html>`;
  return { text: text.join('\n'), html };
}
