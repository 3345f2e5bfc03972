/**
 * Newsletter Markdown to the two parts of an e-mail. marked (GFM) turns the Markdown into HTML, then
 * sanitize-html keeps only an allowlist of tags and attributes, so raw HTML in the Markdown cannot
 * bring scripts, event attributes, styles, frames, forms or unsafe URLs into a volunteer's mail client.
 * The text part is read from the sanitised HTML (see plain-text.ts), so it never shows what the HTML
 * part dropped.
 */
import { Marked } from 'marked';
import sanitizeHtml from 'sanitize-html';
import { htmlToText } from './plain-text';

export interface MarkdownOptions {
  /**
   * Whether images stay in. Off by default in practice: remote images let the sender see who opened a
   * mail. When on, only https images stay; when off, an image becomes its alt text.
   */
  allowRemoteImages: boolean;
}

export interface RenderedPart {
  html: string;
  text: string;
}

const markdown = new Marked({ gfm: true, breaks: false, async: false });

const LINK_SCHEMES = ['http', 'https', 'mailto'];
const IMAGE_SCHEMES = ['https'];
// A link with an unsafe URL, and an image that may not show, become a bare <span> holding their text
// (for an image: its alt text). Renaming to a tag outside the allowlist would be simpler, but
// sanitize-html 2.17.5 then gives the rename to the next closing tag at the same depth.
const PLAIN = 'span';

const TEXT_TAGS = [
  'h1',
  'h2',
  'h3',
  'h4',
  'h5',
  'h6',
  'p',
  'a',
  'strong',
  'b',
  'em',
  'i',
  'del',
  'code',
  'pre',
  'blockquote',
  'ul',
  'ol',
  'li',
  'hr',
  'br',
  'table',
  'thead',
  'tbody',
  'tr',
  'th',
  'td',
  PLAIN,
];

/** True when `url` is absolute with one of `schemes` (relative URLs mean nothing in a mail). */
function hasScheme(url: string | undefined, schemes: readonly string[]): url is string {
  if (url === undefined) return false;
  const match = /^([a-z][a-z0-9+.-]*):/i.exec(url.trim());
  if (!match || !schemes.includes(match[1]!.toLowerCase())) return false;
  // "https:foo" or "http:/x" has a scheme but no host; mailto: needs none.
  return match[1]!.toLowerCase() === 'mailto' || /^[a-z]+:\/\/[^/\s]/i.test(url.trim());
}

function sanitizeOptions(allowRemoteImages: boolean): sanitizeHtml.IOptions {
  return {
    allowedTags: allowRemoteImages ? [...TEXT_TAGS, 'img'] : TEXT_TAGS,
    allowedAttributes: {
      a: ['href', 'title', 'rel'],
      img: ['src', 'alt', 'title', 'width', 'height'],
      ol: ['start'],
      th: ['align'],
      td: ['align'],
      code: ['class'],
    },
    allowedClasses: { code: [/^language-[\w-]+$/] },
    allowedSchemes: LINK_SCHEMES,
    allowedSchemesByTag: { img: IMAGE_SCHEMES },
    allowedSchemesAppliedToAttributes: ['href', 'src', 'cite'],
    allowProtocolRelative: false,
    disallowedTagsMode: 'discard',
    // Also the default; written out so that no later default can let these through as text.
    nonTextTags: ['script', 'style', 'textarea', 'option', 'noscript', 'title', 'head'],
    transformTags: {
      a: (tagName, attribs) => {
        if (!hasScheme(attribs.href, LINK_SCHEMES)) return { tagName: PLAIN, attribs: {} };
        const kept: sanitizeHtml.Attributes = { href: attribs.href.trim(), rel: 'noopener noreferrer' };
        if (attribs.title) kept.title = attribs.title;
        return { tagName, attribs: kept };
      },
      img: (tagName, attribs) => {
        if (!allowRemoteImages || !hasScheme(attribs.src, IMAGE_SCHEMES)) {
          return { tagName: PLAIN, attribs: {}, text: attribs.alt ?? '' };
        }
        return { tagName, attribs };
      },
    },
  };
}

const WITH_IMAGES = sanitizeOptions(true);
const WITHOUT_IMAGES = sanitizeOptions(false);

/** Sanitises HTML on the newsletter allowlist (exported for tests and for HTML from other sources). */
export function sanitizeMailHtml(html: string, options: MarkdownOptions): string {
  return sanitizeHtml(html, options.allowRemoteImages ? WITH_IMAGES : WITHOUT_IMAGES);
}

/**
 * Renders newsletter Markdown (GFM) to sanitised HTML and its plain-text twin. Links keep only http,
 * https and mailto URLs and get rel="noopener noreferrer"; a link with any other URL becomes its text.
 */
export function renderMarkdown(source: string, options: MarkdownOptions): RenderedPart {
  const html = sanitizeMailHtml(markdown.parse(source, { async: false }), options).trim();
  return { html, text: htmlToText(html) };
}
