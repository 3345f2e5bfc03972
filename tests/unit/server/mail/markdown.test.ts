import { Parser } from 'htmlparser2';
import { describe, expect, it } from 'vitest';
import { renderMarkdown } from '../../../../server/mail/markdown';

interface Found {
  tags: string[];
  attributes: { tag: string; name: string; value: string }[];
}

// Reads the output the way a mail client's HTML parser would (entities decoded), so an attribute
// smuggled in through an encoding trick is seen for what it is.
function parseHtml(html: string): Found {
  const found: Found = { tags: [], attributes: [] };
  const parser = new Parser(
    {
      onopentag(tag, attribs) {
        found.tags.push(tag);
        for (const [name, value] of Object.entries(attribs)) found.attributes.push({ tag, name, value });
      },
    },
    { decodeEntities: true, lowerCaseTags: true, lowerCaseAttributeNames: true },
  );
  parser.write(html);
  parser.end();
  return found;
}

const SAFE_SCHEMES = /^(https?:\/\/|mailto:)/i;
const FORBIDDEN_TAGS = [
  'script',
  'style',
  'iframe',
  'svg',
  'form',
  'input',
  'object',
  'embed',
  'img',
  'math',
];

function expectHarmless(html: string) {
  expect(html).not.toMatch(/<\s*(script|style|iframe|svg|form|object|embed|math)\b/i);
  expect(html).not.toMatch(/\son[a-z]+\s*=/i);
  expect(html).not.toMatch(/\sstyle\s*=/i);
  expect(html).not.toMatch(/(java|vb)script\s*:|data\s*:/i);
  const { tags, attributes } = parseHtml(html);
  for (const tag of FORBIDDEN_TAGS) expect(tags).not.toContain(tag);
  for (const attribute of attributes) {
    expect(attribute.name).not.toMatch(/^on/);
    expect(attribute.name).not.toBe('style');
    if (['href', 'src', 'action', 'formaction', 'xlink:href', 'srcset'].includes(attribute.name)) {
      expect(attribute.value.trim()).toMatch(SAFE_SCHEMES);
    }
  }
}

const noImages = { allowRemoteImages: false };
const withImages = { allowRemoteImages: true };

// Payloads after the OWASP XSS Filter Evasion Cheat Sheet's families: script tags, event attributes,
// script URLs (with case and entity tricks), data URLs, frames, SVG, style.
const HOSTILE: Record<string, string> = {
  'a script tag': '<script>alert(1)</script>',
  'an image with onerror': '<img src=x onerror=alert(1)>',
  'a Markdown link to javascript:': '[click](javascript:alert(1))',
  'a Markdown link to JAVASCRIPT:': '[x](JAVASCRIPT:alert(1))',
  'a link to a data: URL': '<a href="data:text/html;base64,PHNjcmlwdD5hbGVydCgxKTwvc2NyaXB0Pg==">open</a>',
  'an iframe': '<iframe src="https://evil.example/"></iframe>',
  'an svg with onload': '<svg onload=alert(1)><circle r="4"/></svg>',
  'a style block': '<style>body { background: url(javascript:alert(1)) }</style>',
  'inline style attributes': '<p style="color:red" onclick="alert(1)">styled</p>',
  'an entity-encoded javascript: URL': '<a href="java&#x73;cript:alert(1)">hi</a>',
  'a decimal-entity javascript: URL': '<a href="&#106;avascript:alert(1)">hi</a>',
  'a tab inside javascript:': '<a href="java\tscript:alert(1)">hi</a>',
  'a vbscript: URL': '[x](vbscript:msgbox(1))',
  'a Markdown image with a javascript: URL': '![x](javascript:alert(1))',
  'a form':
    '<form action="https://evil.example/"><input name="p"><button formaction="javascript:x">go</button></form>',
  'an object and an embed': '<object data="https://evil.example/x.swf"></object><embed src="x.swf">',
  'a reference link to javascript:': '[click][evil]\n\n[evil]: javascript:alert(1)',
  'a meta refresh': '<meta http-equiv="refresh" content="0;url=javascript:alert(1)">',
  'a base tag': '<base href="javascript:alert(1)//">',
  'a math element':
    '<math><maction actiontype="statusline" xlink:href="javascript:alert(1)">x</maction></math>',
};

describe('renderMarkdown against hostile Markdown', () => {
  for (const [situation, markdown] of Object.entries(HOSTILE)) {
    for (const options of [noImages, withImages]) {
      it(`with ${situation} (images ${options.allowRemoteImages ? 'allowed' : 'off'}), leaves nothing that runs`, () => {
        const { html, text } = renderMarkdown(`Before\n\n${markdown}\n\nAfter`, options);
        expectHarmless(html);
        expect(html).toContain('Before');
        expect(html).toContain('After');
        expect(text).not.toMatch(/<[a-z/]/i);
      });
    }
  }

  it('when everything comes at once, still leaves nothing that runs', () => {
    const { html } = renderMarkdown(Object.values(HOSTILE).join('\n\n'), withImages);
    expectHarmless(html);
  });

  it('keeps the text of a link whose URL it drops', () => {
    const { html, text } = renderMarkdown('[click here](javascript:alert(1))', noImages);
    expect(html).toContain('click here');
    expect(html).not.toContain('<a');
    expect(text).toBe('click here');
  });

  it('drops the contents of script and style, not only the tags', () => {
    const { html, text } = renderMarkdown('<script>steal()</script>\n\n<style>p{}</style>\n\nok', noImages);
    expect(html).not.toContain('steal');
    expect(text).toBe('ok');
  });
});

describe('renderMarkdown links', () => {
  it('keeps http, https and mailto links and gives them rel="noopener noreferrer"', () => {
    const { html } = renderMarkdown(
      '[a](https://dipdeck.test/a) [b](http://dipdeck.test/b) [c](mailto:team@dipdeck.test)',
      noImages,
    );
    const links = parseHtml(html).attributes.filter((attribute) => attribute.tag === 'a');
    expect(
      links.filter((attribute) => attribute.name === 'href').map((attribute) => attribute.value),
    ).toEqual(['https://dipdeck.test/a', 'http://dipdeck.test/b', 'mailto:team@dipdeck.test']);
    expect(links.filter((attribute) => attribute.name === 'rel').map((attribute) => attribute.value)).toEqual(
      ['noopener noreferrer', 'noopener noreferrer', 'noopener noreferrer'],
    );
  });

  it('drops relative and protocol-relative links, which mean nothing in a mail', () => {
    const { html } = renderMarkdown('[a](/record) [b](//evil.example/x) [c](record)', noImages);
    expect(html).not.toContain('href');
  });

  it('replaces a rel or target the author wrote with its own rel', () => {
    const { html } = renderMarkdown('<a href="https://x.test/" rel="opener" target="_self">x</a>', noImages);
    expect(html).toContain('<a href="https://x.test/" rel="noopener noreferrer">x</a>');
  });
});

describe('renderMarkdown images', () => {
  const markdown =
    'Look: ![a light curve](https://img.dipdeck.test/lc.png) and ![old](http://img.dipdeck.test/o.png)';

  it('when remote images are off, shows each image as its alt text', () => {
    const { html, text } = renderMarkdown(markdown, noImages);
    expect(parseHtml(html).tags).not.toContain('img');
    expect(html).toContain('a light curve');
    expect(html).not.toContain('img.dipdeck.test');
    expect(text).toBe('Look: a light curve and old');
  });

  it('when remote images are allowed, keeps https images and turns http ones into their alt text', () => {
    const { html } = renderMarkdown(markdown, withImages);
    const sources = parseHtml(html)
      .attributes.filter((attribute) => attribute.tag === 'img' && attribute.name === 'src')
      .map((attribute) => attribute.value);
    expect(sources).toEqual(['https://img.dipdeck.test/lc.png']);
    expect(html).toContain('old');
    expect(html).not.toContain('http://img.dipdeck.test');
  });

  it('keeps no data: image even when images are allowed', () => {
    const { html } = renderMarkdown('![x](data:image/png;base64,iVBORw0KGgo=)', withImages);
    expect(parseHtml(html).tags).not.toContain('img');
  });
});

describe('renderMarkdown allowed content', () => {
  it('keeps headings, emphasis, code, quotes, lists, rules and tables', () => {
    const { html } = renderMarkdown(
      [
        '## Dips of the month',
        'Some **strong** and *em* and `code`.',
        '> a quote',
        '- one\n- two',
        '1. first\n2. second',
        '---',
        '| a | b |\n| - | - |\n| 1 | 2 |',
        '```\nconst x = 1;\n```',
      ].join('\n\n'),
      noImages,
    );
    const { tags } = parseHtml(html);
    for (const tag of [
      'h2',
      'strong',
      'em',
      'code',
      'blockquote',
      'ul',
      'ol',
      'li',
      'hr',
      'table',
      'td',
      'pre',
    ]) {
      expect(tags).toContain(tag);
    }
  });
});

describe('renderMarkdown text part', () => {
  const { text } = renderMarkdown(
    [
      '# Dips of the month',
      'Thanks to you, **42** dips & 3 candidates. Read [the guide](https://dipdeck.test/guide).',
      '- a [snippet](https://dipdeck.test/s/1)\n- another\n  - nested',
      '1. first\n2. second',
      '> candidates are not confirmed planets',
      'Mail team@dipdeck.test or see https://dipdeck.test/record.',
    ].join('\n\n'),
    noImages,
  );

  it('has headings and paragraphs on their own lines, separated by blank lines', () => {
    expect(text.split('\n\n').slice(0, 2)).toEqual([
      'Dips of the month',
      'Thanks to you, 42 dips & 3 candidates. Read the guide (https://dipdeck.test/guide).',
    ]);
  });

  it('writes list items with "- " or their number, nested ones indented', () => {
    expect(text).toContain('- a snippet (https://dipdeck.test/s/1)\n- another\n  - nested');
    expect(text).toContain('1. first\n2. second');
  });

  it('writes quotes with "> " and bare URLs and addresses once', () => {
    expect(text).toContain('> candidates are not confirmed planets');
    expect(text).toContain('Mail team@dipdeck.test or see https://dipdeck.test/record.');
  });

  it('has no tags and no entities', () => {
    expect(text).not.toMatch(/<[a-z/!]/i);
    expect(text).not.toMatch(/&[a-z]+;|&#\d+;|&#x[0-9a-f]+;/i);
  });
});
