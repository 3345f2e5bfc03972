/**
 * The policy put in front of a mail's HTML shown in the app. The iframe's empty sandbox already stops
 * scripts, forms and pop-ups and gives the document an origin of its own; this stops remote images,
 * fonts and style sheets too, so showing a message never tells a tracker (or a real address) it was read.
 */
export const mailFramePolicy =
  "default-src 'none'; style-src 'unsafe-inline'; img-src data:; font-src data:; base-uri 'none'; form-action 'none'";

/**
 * The document to give `<iframe sandbox="" srcdoc>`: the mail's HTML behind that policy and a base that
 * sends links to a new window, which the sandbox refuses to open.
 */
export function sandboxedMailDocument(html: string): string {
  const guard = `<meta http-equiv="Content-Security-Policy" content="${mailFramePolicy}"><base target="_blank">`;
  // The parser moves these into the head whatever follows; after a doctype, so the message keeps its mode.
  const doctype = html.match(/^\s*<!doctype[^>]*>/i)?.[0] ?? '';
  return `${doctype}${guard}${html.slice(doctype.length)}`;
}
