/** Mail texts in Kerfwright's own words; each has a plain-text and an HTML body. */

export interface MailText {
  subject: string;
  text: string;
  html: string;
}

const escapeHtml = (s: string): string =>
  s.replace(
    /[&<>"']/g,
    (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c] ?? c,
  );

/** Builds a mail from a subject, paragraphs and one link. Values are escaped in the HTML body. */
export function composeMail(
  subject: string,
  paragraphs: string[],
  link: { label: string; url: string },
): MailText {
  const text = [...paragraphs, '', `${link.label}: ${link.url}`, '', '— Kerfwright, for your workshop'].join(
    '\n',
  );
  const html = [
    '<!doctype html><html><body style="font-family: sans-serif; line-height: 1.5">',
    ...paragraphs.map((p) => `<p>${escapeHtml(p)}</p>`),
    `<p><a href="${escapeHtml(link.url)}">${escapeHtml(link.label)}</a></p>`,
    '<p style="color:#666">— Kerfwright, for your workshop</p>',
    '</body></html>',
  ].join('');
  return { subject, text, html };
}
