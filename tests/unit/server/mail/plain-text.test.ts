import { describe, expect, it } from 'vitest';
import { htmlToText } from '../../../../server/mail/plain-text';

describe('htmlToText', () => {
  it('decodes entities and collapses white space in paragraphs', () => {
    expect(htmlToText('<p>Tom &amp; Jerry&#39;s\n   &lt;dips&gt;</p>\n<p>two</p>')).toBe(
      "Tom & Jerry's <dips>\n\ntwo",
    );
  });

  it('keeps a line break for <br> and the text of a <pre> as it is', () => {
    expect(htmlToText('<p>one<br>two</p><pre><code>a  b\n  c\n</code></pre>')).toBe('one\ntwo\n\na  b\n  c');
  });

  it('numbers ordered lists from their start and indents an item’s second line under its text', () => {
    expect(htmlToText('<ol start="3"><li><p>three</p><p>more</p></li><li>four</li></ol>')).toBe(
      '3. three\n   more\n4. four',
    );
  });

  it('quotes every line of a blockquote, blank ones too', () => {
    expect(htmlToText('<blockquote><p>a</p><p>b</p></blockquote>')).toBe('> a\n>\n> b');
  });

  it('writes a table row by row with cells separated by " | "', () => {
    expect(
      htmlToText(
        '<table><thead><tr><th>dip</th><th>depth</th></tr></thead><tbody><tr><td>1</td><td>800 ppm</td></tr></tbody></table>',
      ),
    ).toBe('dip | depth\n1 | 800 ppm');
  });

  it('writes a link as "text (url)", a bare one once, a mailto one as its address', () => {
    expect(
      htmlToText(
        '<p><a href="https://d.test/g">the guide</a> <a href="https://d.test/x">https://d.test/x</a> ' +
          '<a href="mailto:team@d.test">team@d.test</a> <a href="mailto:team@d.test">write</a></p>',
      ),
    ).toBe('the guide (https://d.test/g) https://d.test/x team@d.test write (team@d.test)');
  });

  it('skips script and style contents', () => {
    expect(htmlToText('<p>a</p><script>x()</script><style>p{}</style><p>b</p>')).toBe('a\n\nb');
  });
});
