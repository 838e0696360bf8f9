/** An e-mail ready to send: a plain-text part and a simple HTML part saying the same. */
export interface Letter {
  subject: string;
  text: string;
  html: string;
}

export interface LetterContent {
  subject: string;
  greeting: string;
  paragraphs: string[];
  action?: { label: string; url: string };
  /** Why the recipient got this message. */
  why: string;
}

function escapeHtml(s: string): string {
  return s.replace(
    /[&<>"']/g,
    (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!,
  );
}

// Beadroll's sea-glass teal (brand shade 80 of the web theme) on white.
const BRAND = '#176d83';

/** Lays out a letter in Beadroll's look: plain text first, HTML with the same words. */
export function letter(c: LetterContent): Letter {
  const text = [
    c.greeting,
    '',
    ...c.paragraphs.flatMap((p) => [p, '']),
    ...(c.action ? [`${c.action.label}:`, c.action.url, ''] : []),
    '—',
    'Beadroll, the provenance roll for glass bead lots',
    c.why,
  ].join('\n');
  const html = `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><title>${escapeHtml(c.subject)}</title></head>
<body style="margin:0;padding:24px;background:#f5f5f5;font-family:'Atkinson Hyperlegible',Arial,sans-serif;color:#242424">
<div style="max-width:560px;margin:0 auto;background:#ffffff;border-radius:8px;overflow:hidden">
<div style="background:${BRAND};color:#ffffff;padding:16px 24px;font-size:20px;font-weight:bold">Beadroll</div>
<div style="padding:24px;font-size:16px;line-height:1.5">
<p>${escapeHtml(c.greeting)}</p>
${c.paragraphs.map((p) => `<p>${escapeHtml(p)}</p>`).join('\n')}
${
  c.action
    ? `<p><a href="${escapeHtml(c.action.url)}" style="display:inline-block;background:${BRAND};color:#ffffff;padding:10px 18px;border-radius:4px;text-decoration:none">${escapeHtml(c.action.label)}</a></p>
<p style="font-size:13px;color:#616161">Or copy this address into your browser: ${escapeHtml(c.action.url)}</p>`
    : ''
}
</div>
<div style="padding:16px 24px;font-size:13px;color:#616161;border-top:1px solid #e0e0e0">${escapeHtml(c.why)}</div>
</div></body></html>`;
  return { subject: c.subject, text, html };
}
