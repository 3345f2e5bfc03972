import { sandboxedMailDocument } from '@/lib/sandboxed-mail';

/** A mail's HTML, shown where it cannot run anything or load anything (the Outbox, the newsletter preview). */
export function MailFrame({ html, title, className }: { html: string; title: string; className: string }) {
  return (
    <iframe
      // An empty sandbox: no scripts, no forms, no pop-ups, and an origin of its own, not Dipdeck's.
      sandbox=""
      srcDoc={sandboxedMailDocument(html)}
      title={title}
      className={`w-full rounded-lg border border-line bg-white ${className}`}
    />
  );
}
