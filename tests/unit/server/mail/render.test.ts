import { describe, expect, it } from 'vitest';
import {
  NEWSLETTER_REASON,
  type PersonalFields,
  renderNewsletterMessage,
} from '../../../../server/mail/render';

const fields: PersonalFields = {
  displayName: 'Ada <b>',
  verdictsThisMonth: 31,
  dipsCredited: 2,
  candidatesCredited: 1,
  topCampaign: null,
};

const base = {
  headline: 'March on the Deck, {{displayName}}',
  bodyMarkdown:
    'You gave **{{verdictsThisMonth}}** verdicts this month.\n\nSee [your dips](https://dipdeck.test/record).\n\n![chart](https://img.dipdeck.test/c.png)',
  fields,
  unsubscribeUrl: 'https://dipdeck.test/unsubscribe?token=abc&list=news',
  preferencesUrl: 'https://dipdeck.test/record#email',
};

describe('renderNewsletterMessage', () => {
  const message = renderNewsletterMessage(base);

  it('uses the filled-in headline as subject and escapes it in the HTML', () => {
    expect(message.subject).toBe('March on the Deck, Ada <b>');
    expect(message.html).toContain(
      '<h1 style="font-size:24px;line-height:1.25;margin:0 0 16px;">March on the Deck, Ada &lt;b&gt;</h1>',
    );
    expect(message.html).not.toContain('Ada <b>');
  });

  it('fills the personal fields into the body', () => {
    expect(message.html).toContain('You gave <strong>31</strong> verdicts this month.');
    expect(message.text).toContain('You gave 31 verdicts this month.');
  });

  it('puts the Dipdeck name at the top, in one column of at most 600 px', () => {
    expect(message.html).toMatch(/max-width:600px/);
    expect(message.html.indexOf('Dipdeck</div>')).toBeLessThan(message.html.indexOf('<h1'));
    expect(message.text.startsWith('Dipdeck\n\nMarch on the Deck, Ada <b>\n\n')).toBe(true);
  });

  it('says why the reader gets it and links to unsubscribe and to the preferences on My record, in both parts', () => {
    expect(message.html).toContain(NEWSLETTER_REASON);
    expect(message.text).toContain(NEWSLETTER_REASON);
    expect(message.html).toContain('href="https://dipdeck.test/unsubscribe?token=abc&amp;list=news"');
    expect(message.html).toContain('>Unsubscribe from Dipdeck newsletters</a>');
    expect(message.html).toContain('href="https://dipdeck.test/record#email"');
    expect(message.text).toContain(
      'Unsubscribe from Dipdeck newsletters: https://dipdeck.test/unsubscribe?token=abc&list=news',
    );
    expect(message.text).toContain(
      'Change your e-mail preferences on My record: https://dipdeck.test/record#email',
    );
  });

  it('has a text part with links as "text (url)" and no tags', () => {
    expect(message.text).toContain('See your dips (https://dipdeck.test/record).');
    expect(message.text).not.toMatch(/<(?!b>)[a-z/!]/i);
    expect(message.text).not.toMatch(/&[a-z]+;|&#/i);
  });

  it('leaves remote images out unless asked, and keeps https ones when asked', () => {
    expect(message.html).not.toContain('<img');
    expect(message.html).toContain('chart');
    const withImages = renderNewsletterMessage({ ...base, allowRemoteImages: true });
    expect(withImages.html).toContain('<img src="https://img.dipdeck.test/c.png" alt="chart" />');
  });

  it('sanitises the body as renderMarkdown does', () => {
    const hostile = renderNewsletterMessage({
      ...base,
      bodyMarkdown: '<script>alert(1)</script>\n\n[x](javascript:alert(1))\n\n<p onclick="x()">hi</p>',
    });
    expect(hostile.html).not.toMatch(/<script|javascript:|onclick/i);
  });

  it('keeps a subject on one line whatever the headline holds', () => {
    const message = renderNewsletterMessage({ ...base, headline: 'News\r\nBcc: everyone@example.test' });
    expect(message.subject).toBe('News Bcc: everyone@example.test');
  });

  it('refuses an unsubscribe URL that is not http or https, naming it', () => {
    expect(() => renderNewsletterMessage({ ...base, unsubscribeUrl: 'javascript:alert(1)' })).toThrow(
      /unsubscribeUrl must be an absolute http or https URL/,
    );
    expect(() => renderNewsletterMessage({ ...base, preferencesUrl: '/record' })).toThrow(/preferencesUrl/);
  });
});
