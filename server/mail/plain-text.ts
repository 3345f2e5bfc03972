/**
 * The text/plain part of a message, read from the already sanitised HTML part so that both parts say
 * the same thing: headings and paragraphs on their own lines with blank lines between, list items as
 * "- " (or "1. "), links as "text (url)", quotes as "> ". Entities are decoded and no tag is left.
 */
import { Parser } from 'htmlparser2';

interface ElementNode {
  kind: 'element';
  name: string;
  attribs: Record<string, string>;
  children: Node[];
}
interface TextNode {
  kind: 'text';
  text: string;
}
type Node = ElementNode | TextNode;

const BLOCKS = new Set([
  'p',
  'div',
  'h1',
  'h2',
  'h3',
  'h4',
  'h5',
  'h6',
  'ul',
  'ol',
  'li',
  'pre',
  'blockquote',
  'hr',
  'table',
  'thead',
  'tbody',
  'tfoot',
  'tr',
]);
const SKIPPED = new Set(['script', 'style', 'head', 'title']);
const RULE = '----------';

function parse(html: string): ElementNode {
  const root: ElementNode = { kind: 'element', name: '#root', attribs: {}, children: [] };
  const stack: ElementNode[] = [root];
  const parser = new Parser(
    {
      onopentag(name, attribs) {
        const element: ElementNode = { kind: 'element', name, attribs, children: [] };
        stack.at(-1)!.children.push(element);
        stack.push(element);
      },
      ontext(text) {
        stack.at(-1)!.children.push({ kind: 'text', text });
      },
      onclosetag() {
        if (stack.length > 1) stack.pop();
      },
    },
    { decodeEntities: true, lowerCaseTags: true },
  );
  parser.write(html);
  parser.end();
  return root;
}

const isBlock = (node: Node) => node.kind === 'element' && BLOCKS.has(node.name);

function textContent(node: Node): string {
  if (node.kind === 'text') return node.text;
  return node.children.map(textContent).join('');
}

function linkText(element: ElementNode, inner: string): string {
  const href = element.attribs.href;
  if (!href) return inner;
  // For a mailto link the address alone is what a reader can use.
  const url = /^mailto:/i.test(href) ? href.slice('mailto:'.length) : href;
  const shown = inner.trim();
  // An autolink (`www.example.com` → http://www.example.com) already shows its URL.
  if (shown === '' || shown === url || shown === url.replace(/^https?:\/\//i, '')) return url;
  return `${inner} (${url})`;
}

/** Inline content as one string; white space collapsed later, `\n` kept for <br>. */
function inline(node: Node, pre: boolean): string {
  if (node.kind === 'text') return pre ? node.text : node.text.replace(/\s+/g, ' ');
  if (SKIPPED.has(node.name)) return '';
  if (node.name === 'br') return '\n';
  if (node.name === 'img') return node.attribs.alt ?? '';
  const inner = node.children.map((child) => inline(child, pre)).join('');
  if (node.name === 'a') return linkText(node, inner);
  return inner;
}

function paragraph(nodes: Node[]): string {
  return nodes
    .map((node) => inline(node, false))
    .join('')
    .split('\n')
    .map((line) => line.replace(/ {2,}/g, ' ').trim())
    .join('\n')
    .trim();
}

function prefixLines(text: string, first: string, rest: string): string {
  return text
    .split('\n')
    .map((line, index) => (line === '' ? rest.trimEnd() : (index === 0 ? first : rest) + line))
    .join('\n');
}

/** The blocks inside `element`, each rendered; inline runs between blocks become paragraphs. */
function blocks(element: ElementNode): string[] {
  const out: string[] = [];
  let run: Node[] = [];
  const flush = () => {
    const text = paragraph(run);
    if (text !== '') out.push(text);
    run = [];
  };
  for (const child of element.children) {
    if (isBlock(child)) {
      flush();
      const text = block(child as ElementNode);
      if (text !== '') out.push(text);
    } else if (!(child.kind === 'element' && SKIPPED.has(child.name))) {
      run.push(child);
    }
  }
  flush();
  return out;
}

function list(element: ElementNode): string {
  const ordered = element.name === 'ol';
  let number = Number.parseInt(element.attribs.start ?? '1', 10) || 1;
  const items: string[] = [];
  for (const child of element.children) {
    if (child.kind !== 'element' || child.name !== 'li') continue;
    const marker = ordered ? `${number++}. ` : '- ';
    items.push(prefixLines(blocks(child).join('\n'), marker, ' '.repeat(marker.length)));
  }
  return items.join('\n');
}

function table(element: ElementNode): string {
  const rows: string[] = [];
  const visit = (node: ElementNode) => {
    for (const child of node.children) {
      if (child.kind !== 'element') continue;
      if (child.name === 'tr') {
        const cells = child.children.filter(
          (cell): cell is ElementNode =>
            cell.kind === 'element' && (cell.name === 'td' || cell.name === 'th'),
        );
        rows.push(cells.map((cell) => paragraph(cell.children).replace(/\n/g, ' ')).join(' | '));
      } else {
        visit(child);
      }
    }
  };
  visit(element);
  return rows.join('\n');
}

function block(element: ElementNode): string {
  switch (element.name) {
    case 'ul':
    case 'ol':
      return list(element);
    case 'pre':
      return textContent(element).replace(/\n+$/, '');
    case 'blockquote':
      return prefixLines(blocks(element).join('\n\n'), '> ', '> ');
    case 'hr':
      return RULE;
    case 'table':
      return table(element);
    case 'li':
    case 'div':
    case 'thead':
    case 'tbody':
    case 'tfoot':
    case 'tr':
      return blocks(element).join('\n\n');
    default:
      return paragraph(element.children);
  }
}

/** Plain text for `html`, which should already be sanitised (scripts and styles are skipped anyway). */
export function htmlToText(html: string): string {
  return blocks(parse(html)).join('\n\n');
}
