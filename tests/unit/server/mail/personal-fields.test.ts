import { describe, expect, it } from 'vitest';
import { renderMarkdown } from '../../../../server/mail/markdown';
import {
  escapeMarkdown,
  fillPersonalFields,
  PERSONAL_FIELDS,
  type PersonalFields,
  unknownPlaceholders,
} from '../../../../server/mail/personal-fields';

const fields: PersonalFields = {
  displayName: 'Ada',
  verdictsThisMonth: 1234,
  dipsCredited: 7,
  candidatesCredited: 2,
  topCampaign: 'Southern K dwarfs',
};

const rendered = (template: string, values: PersonalFields) =>
  renderMarkdown(fillPersonalFields(template, values), { allowRemoteImages: true });

describe('fillPersonalFields', () => {
  it('fills every personal field, with white space allowed inside the braces', () => {
    const filled = fillPersonalFields(
      '{{displayName}} {{ verdictsThisMonth }} {{dipsCredited}} {{candidatesCredited}} {{  topCampaign}}',
      fields,
    );
    expect(renderMarkdown(filled, { allowRemoteImages: false }).text).toBe('Ada 1,234 7 2 Southern K dwarfs');
  });

  it('says "none yet" for a volunteer with no top campaign', () => {
    expect(rendered('Top: {{topCampaign}}', { ...fields, topCampaign: null }).text).toBe('Top: none yet');
  });

  it('leaves unknown placeholders visible as written', () => {
    expect(fillPersonalFields('Hi {{firstName}} and {{ display name }}', fields)).toBe(
      'Hi {{firstName}} and {{ display name }}',
    );
  });

  // Each display name is one a volunteer could choose; after render and sanitise it must read as itself.
  const hostileNames = [
    '<script>x</script>',
    '**bold**',
    '[a](javascript:b)',
    '{{displayName}}',
    '<img src=x onerror=alert(1)>',
    '![x](https://tracker.example/p.png)',
    'https://evil.example/login',
    'www.evil.example',
    'mallory@evil.example',
    '# heading',
    '1. list',
    '`code` _em_ ~~del~~',
    '&amp; &lt;b&gt;',
    'back\\slash',
    'Line\n\n# two',
  ];

  for (const name of hostileNames) {
    it(`with the display name ${JSON.stringify(name)}, shows it as literal text`, () => {
      const { html, text } = rendered('Hello {{displayName}}!', { ...fields, displayName: name });
      const expected = `Hello ${name.replace(/\s+/g, ' ')}!`;
      expect(text).toBe(expected);
      expect(html).toMatch(/^<p>[^<]*<\/p>$/);
      expect(html).not.toMatch(/<(?!\/?p>)/);
    });
  }

  it('does not fill a placeholder that arrives inside a value', () => {
    const filled = fillPersonalFields('{{displayName}} / {{topCampaign}}', {
      ...fields,
      displayName: '{{topCampaign}}',
    });
    expect(renderMarkdown(filled, { allowRemoteImages: false }).text).toBe(
      '{{topCampaign}} / Southern K dwarfs',
    );
  });

  it('escapes a campaign name too', () => {
    const { html } = rendered('{{topCampaign}}', { ...fields, topCampaign: '<b>K</b> [x](javascript:y)' });
    expect(html).toBe('<p>&lt;b&gt;K&lt;/b&gt; [x](javascript:y)</p>');
  });
});

describe('escapeMarkdown', () => {
  it('backslash-escapes every ASCII punctuation character and keeps letters, digits and spaces', () => {
    expect(escapeMarkdown('a*b_c 1')).toBe('a\\*b\\_c 1');
    expect(escapeMarkdown('Zoë 42')).toBe('Zoë 42');
  });
});

describe('unknownPlaceholders', () => {
  it('reports each unknown placeholder once, as written, in order', () => {
    expect(
      unknownPlaceholders(
        '{{displayName}} {{firstName}} {{ verdictsThisMonth }} {{ dips }} {{firstName}} {{}}',
      ),
    ).toEqual(['{{firstName}}', '{{ dips }}', '{{}}']);
  });

  it('reports nothing when every placeholder is a personal field', () => {
    expect(unknownPlaceholders(PERSONAL_FIELDS.map((field) => `{{${field.name}}}`).join(' '))).toEqual([]);
  });
});

describe('PERSONAL_FIELDS', () => {
  it('describes every field of PersonalFields in one line', () => {
    expect(PERSONAL_FIELDS.map((field) => field.name).sort()).toEqual(Object.keys(fields).sort());
    for (const field of PERSONAL_FIELDS) expect(field.description).toMatch(/^[^\n]{10,120}$/);
  });
});
