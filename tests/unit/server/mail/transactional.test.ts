import { describe, expect, it } from 'vitest';
import {
  CONFIRM_LINK_VALID_HOURS,
  RESET_LINK_VALID_HOURS,
  renderTransactionalMessage,
} from '../../../../server/mail/transactional';

const noTags = /<[a-z/!]/i;

describe('renderTransactionalMessage confirm-address', () => {
  const url = 'https://dipdeck.test/confirm-email?token=t0k&x=1';
  const message = renderTransactionalMessage('confirm-address', { displayName: 'Ada', confirmUrl: url });

  it('carries the link in both parts and says it works for 24 hours', () => {
    expect(CONFIRM_LINK_VALID_HOURS).toBe(24);
    expect(message.html).toContain('href="https://dipdeck.test/confirm-email?token=t0k&amp;x=1"');
    expect(message.text).toContain(url);
    expect(message.text).toContain('24 hours');
    expect(message.html).toContain('24 hours');
  });

  it('has a subject, greets by name, has no unsubscribe link and says why it was sent', () => {
    expect(message.subject).toBe('Dipdeck: confirm your e-mail address');
    expect(message.text).toContain('Hello Ada,');
    expect(message.text).not.toMatch(/unsubscribe/i);
    expect(message.text).toMatch(/You receive this because/);
    expect(message.text).not.toMatch(noTags);
  });
});

describe('renderTransactionalMessage password-reset', () => {
  const url = 'https://dipdeck.test/password-reset/confirm?token=r3s';
  const message = renderTransactionalMessage('password-reset', { displayName: 'Ada', resetUrl: url });

  it('carries the link and says it is valid for 1 hour and works once', () => {
    expect(RESET_LINK_VALID_HOURS).toBe(1);
    expect(message.html).toContain(`href="${url}"`);
    expect(message.text).toContain(url);
    for (const part of [message.html, message.text]) {
      expect(part).toContain('valid for 1 hour and works only once');
    }
  });

  it('tells a reader who did not ask to ignore it', () => {
    expect(message.text).toContain(
      'If you did not ask for this, ignore this mail; your password stays as it is.',
    );
    expect(message.text).not.toMatch(/unsubscribe/i);
  });
});

describe('renderTransactionalMessage moderator-warning', () => {
  const message = renderTransactionalMessage('moderator-warning', {
    displayName: '<i>Mallory</i>',
    moderatorNote: 'Please look <b>closer</b> at "flat" snippets & [marks](javascript:x).\n\nThanks!',
    recordUrl: 'https://dipdeck.test/record',
  });

  it('escapes the note and the name in the HTML and quotes the note in the text', () => {
    expect(message.html).toContain(
      'Please look &lt;b&gt;closer&lt;/b&gt; at &quot;flat&quot; snippets &amp; [marks](javascript:x).',
    );
    expect(message.html).not.toContain('<b>closer');
    expect(message.html).not.toContain('<i>Mallory');
    expect(message.html).not.toMatch(/href="javascript/i);
    expect(message.text).toContain(
      '> Please look <b>closer</b> at "flat" snippets & [marks](javascript:x).\n>\n> Thanks!',
    );
  });

  it('says what happens next and why it was sent, with a link to My record and no unsubscribe link', () => {
    expect(message.text).toContain('What happens next');
    expect(message.text).toContain('My record: https://dipdeck.test/record');
    expect(message.html).toContain('href="https://dipdeck.test/record"');
    expect(message.text).toMatch(/You receive this service message because/);
    expect(message.html).not.toMatch(/unsubscribe/i);
  });
});

describe('renderTransactionalMessage links', () => {
  it('refuses a link that is not http or https, naming the argument', () => {
    expect(() =>
      renderTransactionalMessage('password-reset', { displayName: 'A', resetUrl: 'javascript:alert(1)' }),
    ).toThrow(/resetUrl must be an absolute http or https URL/);
  });
});
