/**
 * What the mail services call: newsletter and transactional messages as subject, HTML and text, with
 * no I/O. The transport and the queue live elsewhere in server/mail/.
 */
import { checkedWebUrl, type MessageParts, renderLayout, subjectLine } from './layout';
import { renderMarkdown } from './markdown';
import { fillPersonalFields, fillPersonalFieldsAsText, type PersonalFields } from './personal-fields';

export type { MessageParts } from './layout';
export { type MarkdownOptions, type RenderedPart, renderMarkdown } from './markdown';
export {
  fillPersonalFields,
  NO_TOP_CAMPAIGN,
  PERSONAL_FIELDS,
  type PersonalFieldName,
  type PersonalFields,
  unknownPlaceholders,
} from './personal-fields';
export {
  CONFIRM_LINK_VALID_HOURS,
  type ConfirmAddressInput,
  type ModeratorWarningInput,
  type PasswordResetInput,
  RESET_LINK_VALID_HOURS,
  renderTransactionalMessage,
  type TransactionalInputs,
  type TransactionalKind,
} from './transactional';

export interface NewsletterInput {
  /** Plain text; may hold personal fields. Becomes the subject and the heading. */
  headline: string;
  bodyMarkdown: string;
  fields: PersonalFields;
  unsubscribeUrl: string;
  preferencesUrl: string;
  /** Off unless the scientist chose it: remote images tell the sender who opened the mail. */
  allowRemoteImages?: boolean;
}

export const NEWSLETTER_REASON = 'You receive this because you opted in to Dipdeck newsletters.';

/**
 * One volunteer's copy of a newsletter.
 * @throws Error naming the argument when unsubscribeUrl or preferencesUrl is not an http(s) URL.
 */
export function renderNewsletterMessage(input: NewsletterInput): MessageParts {
  const unsubscribeUrl = checkedWebUrl('unsubscribeUrl', input.unsubscribeUrl);
  const preferencesUrl = checkedWebUrl('preferencesUrl', input.preferencesUrl);
  const headline = subjectLine(fillPersonalFieldsAsText(input.headline, input.fields));
  const body = renderMarkdown(fillPersonalFields(input.bodyMarkdown, input.fields), {
    allowRemoteImages: input.allowRemoteImages ?? false,
  });
  const { html, text } = renderLayout({
    headline,
    bodyHtml: body.html,
    bodyText: body.text,
    reason: NEWSLETTER_REASON,
    footerLinks: [
      { label: 'Change your e-mail preferences on My record', url: preferencesUrl },
      { label: 'Unsubscribe from Dipdeck newsletters', url: unsubscribeUrl },
    ],
  });
  return { subject: headline, html, text };
}
