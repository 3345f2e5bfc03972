import { describe, expect, it } from 'vitest';
import { defaultView, formatSize, messagePolicy, sandboxedDocument } from '@/features/admin/lib/outbox';

describe('formatSize', () => {
  it('counts bytes under a thousand, then kB and MB in powers of 1000', () => {
    expect(formatSize(0)).toBe('0 B');
    expect(formatSize(999)).toBe('999 B');
    expect(formatSize(14_230)).toBe('14.2 kB');
    expect(formatSize(1_300_000)).toBe('1.3 MB');
  });
});

describe('defaultView', () => {
  it('opens the HTML when there is some, else the plain text, else the headers', () => {
    expect(defaultView({ html: '<p>Hi</p>', text: 'Hi' })).toBe('html');
    expect(defaultView({ html: null, text: 'Hi' })).toBe('text');
    expect(defaultView({ html: null, text: null })).toBe('headers');
  });
});

describe('sandboxedDocument', () => {
  it('puts the content security policy and a new-window base before the message', () => {
    const document = sandboxedDocument('<p>Hello <img src="https://tracker.example/p.gif"></p>');
    expect(
      document.startsWith(`<meta http-equiv="Content-Security-Policy" content="${messagePolicy}">`),
    ).toBe(true);
    expect(document).toContain('<base target="_blank"><p>Hello');
    expect(messagePolicy).toContain('img-src data:');
    expect(messagePolicy).toContain("default-src 'none'");
  });

  it('keeps a doctype first, so the message is laid out in the mode it asked for', () => {
    const document = sandboxedDocument('<!DOCTYPE html><html><body>Hi</body></html>');
    expect(document.startsWith('<!DOCTYPE html><meta http-equiv="Content-Security-Policy"')).toBe(true);
    expect(document.endsWith('<html><body>Hi</body></html>')).toBe(true);
  });
});
