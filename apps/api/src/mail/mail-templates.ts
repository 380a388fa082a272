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

/** A link in a mail: what it opens, and where. */
export interface MailLink {
  label: string;
  url: string;
}

/** A paragraph followed by a list of links (each job a mail names, say), one a line. */
export interface MailLinkList {
  text: string;
  links: MailLink[];
}

/**
 * The address of one of the app's pages, from the app's address as configured (a trailing slash on it or a
 * missing one on the path makes no double or missing slash): appLink('https://kw.example/', 'jobs/1').
 */
export function appLink(appUrl: string, path: string): string {
  return `${appUrl.replace(/\/+$/, '')}/${path.replace(/^\/+/, '')}`;
}

/**
 * Builds a mail from a subject, paragraphs (plain, or followed by a list of links) and one main link. Values
 * are escaped in the HTML body; in the text body each listed link is a line "- label: url".
 */
export function composeMail(
  subject: string,
  paragraphs: (string | MailLinkList)[],
  link: MailLink,
): MailText {
  const textOf = (p: string | MailLinkList) =>
    typeof p === 'string' ? p : [p.text, ...p.links.map((l) => `- ${l.label}: ${l.url}`)].join('\n');
  const htmlOf = (p: string | MailLinkList) =>
    typeof p === 'string'
      ? `<p>${escapeHtml(p)}</p>`
      : `<p>${escapeHtml(p.text)}</p><ul>${p.links
          .map((l) => `<li><a href="${escapeHtml(l.url)}">${escapeHtml(l.label)}</a></li>`)
          .join('')}</ul>`;
  const text = [
    ...paragraphs.map(textOf),
    '',
    `${link.label}: ${link.url}`,
    '',
    '— Kerfwright, for your workshop',
  ].join('\n');
  const html = [
    '<!doctype html><html><body style="font-family: sans-serif; line-height: 1.5">',
    ...paragraphs.map(htmlOf),
    `<p><a href="${escapeHtml(link.url)}">${escapeHtml(link.label)}</a></p>`,
    '<p style="color:#666">— Kerfwright, for your workshop</p>',
    '</body></html>',
  ].join('');
  return { subject, text, html };
}
