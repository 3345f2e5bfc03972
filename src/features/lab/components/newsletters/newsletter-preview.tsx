import { useId, useState } from 'react';
import { Alert } from '@/components/alert';
import { MailFrame } from '@/components/mail-frame';
import { ViewSwitch } from '@/components/view-switch';
import type { NewsletterPreview as Preview } from '../../lib/newsletters';

type View = 'html' | 'text';
const viewLabels: Record<View, string> = { html: 'As e-mail', text: 'Plain text' };

/** Unknown placeholders go out as written, braces and all, so the writer hears of them before sending. */
export function UnknownPlaceholdersWarning({ placeholders }: { placeholders: readonly string[] }) {
  if (placeholders.length === 0) return null;
  return (
    <Alert tone="danger" title="Unknown personal fields">
      <p>
        {placeholders.length === 1
          ? 'This placeholder is not a personal field'
          : 'These placeholders are not personal fields'}{' '}
        and would reach readers exactly as written:{' '}
        {placeholders.map((placeholder, index) => (
          <span key={placeholder}>
            {index > 0 ? ', ' : null}
            <code className="font-mono">{placeholder}</code>
          </span>
        ))}
        . Check the spelling against the list of personal fields.
      </p>
    </Alert>
  );
}

/** The rendered newsletter, as the server made it for the person looking, in a sandbox or as plain text. */
export function NewsletterPreviewPanel({ preview, updating }: { preview: Preview; updating?: boolean }) {
  const [view, setView] = useState<View>('html');
  const panelId = useId();
  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <ViewSwitch
          legend="Show the preview"
          legendHidden
          labels={viewLabels}
          value={view}
          onChange={setView}
          controls={panelId}
        />
        <span aria-live="polite" className="text-sm text-muted">
          {updating ? 'Updating…' : ''}
        </span>
      </div>
      <p className="text-sm text-ink">
        <span className="font-medium text-muted">Subject: </span>
        {preview.subject}
      </p>
      <div id={panelId}>
        {view === 'html' ? (
          <MailFrame html={preview.html} title={`Preview of “${preview.subject}”`} className="h-[32rem]" />
        ) : (
          <pre className="max-h-[32rem] overflow-auto rounded-lg border border-line bg-surface p-4 font-mono text-sm whitespace-pre-wrap break-words text-ink">
            {preview.text}
          </pre>
        )}
      </div>
      <p className="text-sm text-muted">
        Shown with your own personal fields. Nothing it points at is loaded here, remote images included.
      </p>
    </div>
  );
}
