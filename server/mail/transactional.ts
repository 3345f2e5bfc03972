/**
 * Service mail: confirming an address, resetting a password, a moderator's warning. These go to
 * everyone who needs them, newsletter opt-in or not, so they carry no unsubscribe link; instead each
 * says why it was sent.
 */
import {
  buttonHtml,
  checkedWebUrl,
  type MessageParts,
  paragraphsHtml,
  renderLayout,
  subjectLine,
} from './layout';

/** How long a confirmation link works; the token service should expire its tokens to match. */
export const CONFIRM_LINK_VALID_HOURS = 24;
/** How long a password-reset link works; it also works only once. */
export const RESET_LINK_VALID_HOURS = 1;

export interface ConfirmAddressInput {
  displayName: string;
  confirmUrl: string;
}

export interface PasswordResetInput {
  displayName: string;
  resetUrl: string;
}

export interface ModeratorWarningInput {
  displayName: string;
  /** Plain text written by the moderator; escaped here, line breaks kept. */
  moderatorNote: string;
  /** My record, where the volunteer sees their verdicts. */
  recordUrl: string;
}

export interface TransactionalInputs {
  'confirm-address': ConfirmAddressInput;
  'password-reset': PasswordResetInput;
  'moderator-warning': ModeratorWarningInput;
}

export type TransactionalKind = keyof TransactionalInputs;

const hours = (count: number) => (count === 1 ? '1 hour' : `${count} hours`);

function greeting(displayName: string): string {
  const name = displayName.replace(/\s+/g, ' ').trim();
  return name === '' ? 'Hello,' : `Hello ${name},`;
}

function confirmAddress(input: ConfirmAddressInput): MessageParts {
  const url = checkedWebUrl('confirmUrl', input.confirmUrl);
  const headline = 'Confirm your e-mail address';
  const intro = [
    greeting(input.displayName),
    'Please confirm that this is your e-mail address, so Dipdeck can reach you about your account.',
  ];
  const after = [
    `The link works for ${hours(CONFIRM_LINK_VALID_HOURS)}. After that, ask for a new one on My record.`,
    'If you did not sign up for Dipdeck or change your address, ignore this mail: nothing changes.',
  ];
  const { html, text } = renderLayout({
    headline,
    bodyHtml: [paragraphsHtml(intro), buttonHtml('Confirm my address', url), paragraphsHtml(after)].join(
      '\n',
    ),
    bodyText: [...intro, `Confirm your address: ${url}`, ...after].join('\n\n'),
    reason: 'You receive this because someone entered this address on Dipdeck.',
    footerLinks: [],
  });
  return { subject: `Dipdeck: ${headline.toLowerCase()}`, html, text };
}

function passwordReset(input: PasswordResetInput): MessageParts {
  const url = checkedWebUrl('resetUrl', input.resetUrl);
  const headline = 'Choose a new password';
  const intro = [greeting(input.displayName), 'Someone asked to reset the password of your Dipdeck account.'];
  const after = [
    `The link is valid for ${hours(RESET_LINK_VALID_HOURS)} and works only once.`,
    'If you did not ask for this, ignore this mail; your password stays as it is.',
  ];
  const { html, text } = renderLayout({
    headline,
    bodyHtml: [paragraphsHtml(intro), buttonHtml('Choose a new password', url), paragraphsHtml(after)].join(
      '\n',
    ),
    bodyText: [...intro, `Choose a new password: ${url}`, ...after].join('\n\n'),
    reason: 'You receive this because a password reset was asked for on Dipdeck with this address.',
    footerLinks: [],
  });
  return { subject: 'Dipdeck: reset your password', html, text };
}

function moderatorWarning(input: ModeratorWarningInput): MessageParts {
  const url = checkedWebUrl('recordUrl', input.recordUrl);
  const note = input.moderatorNote.replace(/\r\n|\r/g, '\n').trim();
  const headline = 'A note from a Dipdeck moderator';
  const intro = [
    greeting(input.displayName),
    'A moderator looked at some of your recent verdicts on the Deck and wrote you this note:',
  ];
  const next = [
    'What happens next: nothing changes in your account today, and your verdicts keep counting. ' +
      'A moderator may look at your verdicts again; if the problem goes on, they can suspend your ' +
      'account, and from then on your verdicts stop counting. If you think this note is a mistake, ' +
      'write to the team.',
    'You can see your verdicts and your accuracy on controls on My record.',
  ];
  const quote =
    '<blockquote style="margin:16px 0;padding:8px 16px;border-left:4px solid #c9d2de;color:#1d2433;">' +
    `${paragraphsHtml(note.split(/\n{2,}/))}</blockquote>`;
  const { html, text } = renderLayout({
    headline,
    bodyHtml: [paragraphsHtml(intro), quote, paragraphsHtml(next), buttonHtml('Open My record', url)].join(
      '\n',
    ),
    bodyText: [
      ...intro,
      note
        .split('\n')
        .map((line) => (line === '' ? '>' : `> ${line}`))
        .join('\n'),
      ...next,
      `My record: ${url}`,
    ].join('\n\n'),
    reason:
      'You receive this service message because you give verdicts on Dipdeck and a moderator needed to ' +
      'reach you. It is sent whatever your newsletter choices are.',
    footerLinks: [],
  });
  return { subject: 'Dipdeck: a note from a moderator', html, text };
}

/**
 * A transactional message of the given kind.
 * @throws Error naming the argument when its link is not an http(s) URL.
 */
export function renderTransactionalMessage<K extends TransactionalKind>(
  kind: K,
  input: TransactionalInputs[K],
): MessageParts {
  const parts = (() => {
    switch (kind) {
      case 'confirm-address':
        return confirmAddress(input as ConfirmAddressInput);
      case 'password-reset':
        return passwordReset(input as PasswordResetInput);
      case 'moderator-warning':
        return moderatorWarning(input as ModeratorWarningInput);
      default:
        throw new Error(
          `kind must be one of confirm-address, password-reset, moderator-warning, got ${kind}`,
        );
    }
  })();
  return { ...parts, subject: subjectLine(parts.subject) };
}
