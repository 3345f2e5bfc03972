/**
 * The frame around every Dipdeck mail: the name at the top, a headline, the body, and a footer that
 * says why the reader gets the mail. One column of at most 600 px, the system font stack, inline
 * styles only (mail clients drop <style> blocks and external sheets), no tables.
 */

export interface MessageParts {
  subject: string;
  html: string;
  text: string;
}

export interface FooterLink {
  label: string;
  url: string;
}

export interface LayoutInput {
  /** Plain text; escaped here. */
  headline: string;
  /** Already safe HTML: sanitised Markdown or HTML built from escaped values. */
  bodyHtml: string;
  bodyText: string;
  /** Plain text: why the reader receives this mail. */
  reason: string;
  footerLinks: readonly FooterLink[];
}

const HTML_ESCAPES: Record<string, string> = {
  '&': '&amp;',
  '<': '&lt;',
  '>': '&gt;',
  '"': '&quot;',
  "'": '&#39;',
};

/** Text safe to put between tags or inside a double-quoted attribute. */
export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (character) => HTML_ESCAPES[character]!);
}

/**
 * Checks a link that our own server built (unsubscribe, confirmation, reset, My record).
 * @throws Error naming the argument when `url` is not an absolute http or https URL.
 */
export function checkedWebUrl(name: string, url: string): string {
  let parsed: URL | undefined;
  try {
    parsed = new URL(url);
  } catch {
    parsed = undefined;
  }
  if (!parsed || (parsed.protocol !== 'https:' && parsed.protocol !== 'http:')) {
    throw new Error(`${name} must be an absolute http or https URL, got ${JSON.stringify(url)}`);
  }
  return url;
}

/** A subject line as one line of plain text: CR and LF would start a new mail header. */
export function subjectLine(text: string): string {
  return text.replace(/\s+/g, ' ').trim();
}

const FONT = "-apple-system, BlinkMacSystemFont, 'Segoe UI', Roboto, 'Helvetica Neue', Arial, sans-serif";
const INK = '#1d2433';
const MUTED = '#5b6475';
const ACCENT = '#0f5c8c';

/** A link styled as a button, for the one thing a transactional mail asks the reader to do. */
export function buttonHtml(label: string, url: string): string {
  return (
    `<p style="margin:24px 0;"><a href="${escapeHtml(url)}" rel="noopener noreferrer" ` +
    `style="display:inline-block;padding:12px 20px;background:${ACCENT};color:#ffffff;` +
    `text-decoration:none;border-radius:6px;font-weight:600;">${escapeHtml(label)}</a></p>`
  );
}

/** Paragraphs of plain text as HTML, each escaped, line breaks kept. */
export function paragraphsHtml(paragraphs: readonly string[]): string {
  return paragraphs
    .map((paragraph) => `<p>${escapeHtml(paragraph).replace(/\r\n|\r|\n/g, '<br>')}</p>`)
    .join('\n');
}

export function renderLayout(input: LayoutInput): { html: string; text: string } {
  const links = input.footerLinks
    .map(
      (link) =>
        `<a href="${escapeHtml(link.url)}" rel="noopener noreferrer" style="color:${MUTED};">${escapeHtml(link.label)}</a>`,
    )
    .join(' &middot; ');
  const headline = escapeHtml(input.headline);
  const html = `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${headline}</title>
</head>
<body style="margin:0;padding:0;background:#f3f5f8;">
<div style="max-width:600px;margin:0 auto;padding:24px 16px;font-family:${FONT};font-size:16px;line-height:1.5;color:${INK};">
<div style="font-size:20px;font-weight:700;letter-spacing:0.02em;color:${ACCENT};padding-bottom:12px;border-bottom:2px solid ${ACCENT};">Dipdeck</div>
<div style="background:#ffffff;padding:24px;margin-top:16px;border-radius:8px;">
<h1 style="font-size:24px;line-height:1.25;margin:0 0 16px;">${headline}</h1>
${input.bodyHtml}
</div>
<div style="font-size:13px;color:${MUTED};padding:16px 4px 0;">
<p style="margin:0 0 8px;">${escapeHtml(input.reason)}</p>
${links === '' ? '' : `<p style="margin:0;">${links}</p>`}
</div>
</div>
</body>
</html>
`;
  const footerText = [input.reason, ...input.footerLinks.map((link) => `${link.label}: ${link.url}`)].join(
    '\n',
  );
  const text = `Dipdeck\n\n${input.headline}\n\n${input.bodyText}\n\n-- \n${footerText}\n`;
  return { html, text };
}
