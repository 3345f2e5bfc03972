// @vitest-environment jsdom
import { QueryClientProvider } from '@tanstack/react-query';
import { act, cleanup, fireEvent, render, screen, waitFor, within } from '@testing-library/react';
import { MemoryRouter, Route, Routes } from 'react-router-dom';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { NewNewsletterPage } from '@/features/lab/components/newsletters/new-newsletter-page';
import { NewsletterPage } from '@/features/lab/components/newsletters/newsletter-page';
import { NewslettersPage } from '@/features/lab/components/newsletters/newsletters-page';
import type { Newsletter } from '@/features/lab/lib/newsletters';
import { createQueryClient } from '@/lib/query-client';

// What Testing Library sets itself when the test runner has global hooks (ours are imported).
(globalThis as { IS_REACT_ACT_ENVIRONMENT?: boolean }).IS_REACT_ACT_ENVIRONMENT = true;

const known = new Set([
  'displayName',
  'verdictsThisMonth',
  'dipsCredited',
  'candidatesCredited',
  'topCampaign',
]);

function newsletter(over: Partial<Newsletter> = {}): Newsletter {
  return {
    id: 5,
    authorId: 3,
    headline: 'Sector 12 is done',
    bodyMarkdown: 'Thank you, {{displayName}}.',
    audience: { kind: 'opted-in' },
    allowRemoteImages: false,
    status: 'draft',
    scheduledFor: null,
    sentAt: null,
    lastError: null,
    createdAt: '2026-12-01T10:00:00.000Z',
    updatedAt: '2026-12-01T10:00:00.000Z',
    unknownPlaceholders: [],
    audienceSize: 12,
    progress: {
      recipients: null,
      queued: 0,
      sending: 0,
      sent: 0,
      failed: 0,
      skippedUnsubscribed: 0,
      unknown: 0,
    },
    ...over,
  };
}

interface Sent {
  method: string;
  path: string;
  body: unknown;
}

/** The routes of server/http/routes/newsletters.ts, in memory, answering as the server does. */
function fakeApi({ list = [] as Newsletter[], sendAnswer = 'accept' as 'accept' | 'conflict' } = {}) {
  let items = [...list];
  const sent: Sent[] = [];
  const json = (status: number, body: unknown) =>
    new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });
  vi.stubGlobal(
    'fetch',
    vi.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
      const url = new URL(String(input), 'http://localhost');
      const method = init?.method ?? 'GET';
      const body = init?.body ? JSON.parse(String(init.body)) : undefined;
      if (url.pathname === '/api/auth/csrf') return json(200, { token: 'csrf-token' });
      sent.push({ method, path: url.pathname, body });
      if (url.pathname === '/api/campaigns') return json(200, { campaigns: [] });
      if (url.pathname === '/api/newsletters/preview') {
        const unknown = [...`${body.headline}\n${body.bodyMarkdown}`.matchAll(/\{\{([^{}\r\n]{0,80})\}\}/g)]
          .filter((m) => !known.has(m[1]!.trim()))
          .map((m) => m[0]);
        const filled = (text: string) => text.replaceAll('{{displayName}}', 'Dr Sana Scientist');
        return json(200, {
          preview: {
            subject: filled(body.headline),
            html: `<!doctype html><html><body><h1>${filled(body.headline)}</h1><p>${filled(body.bodyMarkdown)}</p></body></html>`,
            text: `${filled(body.headline)}\n\n${filled(body.bodyMarkdown)}\n\nUnsubscribe: http://x.test/u`,
            unknownPlaceholders: unknown,
          },
        });
      }
      if (url.pathname === '/api/newsletters') {
        if (method === 'GET') return json(200, { newsletters: items });
        if (!body.headline.trim()) {
          return json(400, {
            error: {
              code: 'validation_failed',
              message: 'The body is not valid',
              fields: { headline: 'Write a headline' },
            },
          });
        }
        const created = newsletter({ id: 9, ...body });
        items = [created, ...items];
        return json(201, { newsletter: created });
      }
      const match = /^\/api\/newsletters\/(\d+)(\/(test|send))?$/.exec(url.pathname);
      const found = items.find((n) => n.id === Number(match?.[1]));
      if (!found) return json(404, { error: { code: 'not_found', message: 'Newsletter not found' } });
      if (match?.[3] === 'test')
        return json(202, { message: 'A test copy is on its way to sana@demo.test.' });
      if (match?.[3] === 'send') {
        if (sendAnswer === 'conflict') {
          return json(409, {
            error: { code: 'already_sent', message: 'This newsletter is sent; it cannot be sent again' },
          });
        }
        const changed = newsletter({
          ...found,
          status: body.at ? 'scheduled' : 'sending',
          scheduledFor: body.at ?? null,
        });
        items = items.map((n) => (n.id === found.id ? changed : n));
        return json(202, { newsletter: changed, audienceSize: 42 });
      }
      return json(200, { newsletter: found });
    }),
  );
  return sent;
}

function renderAt(path: string) {
  render(
    <QueryClientProvider client={createQueryClient()}>
      <MemoryRouter initialEntries={[path]}>
        <Routes>
          <Route path="/lab/newsletters" element={<NewslettersPage />} />
          <Route path="/lab/newsletters/new" element={<NewNewsletterPage />} />
          <Route path="/lab/newsletters/5" element={<NewsletterPage newsletterId={5} />} />
          <Route path="/lab/newsletters/9" element={<p>Newsletter 9 opened</p>} />
        </Routes>
      </MemoryRouter>
    </QueryClientProvider>,
  );
}

afterEach(() => {
  cleanup();
  vi.useRealTimers();
  vi.unstubAllGlobals();
});

const previews = (sent: Sent[]) => sent.filter((s) => s.path === '/api/newsletters/preview');

describe('the composer', () => {
  it('asks for the preview once typing pauses, with the last text only, and shows it in an empty sandbox', async () => {
    vi.useFakeTimers();
    const sent = fakeApi();
    renderAt('/lab/newsletters/new');
    fireEvent.change(screen.getByLabelText('Headline'), { target: { value: 'Hello {{displayName}}' } });
    const body = screen.getByLabelText(/^Text/);
    fireEvent.change(body, { target: { value: 'Th' } });
    await act(() => vi.advanceTimersByTimeAsync(200));
    fireEvent.change(body, { target: { value: 'Thanks {{dipsCreditd}}' } });
    await act(() => vi.advanceTimersByTimeAsync(399));
    expect(previews(sent)).toHaveLength(0);

    await act(() => vi.advanceTimersByTimeAsync(1));
    await act(() => vi.advanceTimersByTimeAsync(50));
    expect(previews(sent).map((s) => s.body)).toEqual([
      { headline: 'Hello {{displayName}}', bodyMarkdown: 'Thanks {{dipsCreditd}}', allowRemoteImages: false },
    ]);
    const frame = screen.getByTitle('Preview of “Hello Dr Sana Scientist”');
    expect(frame.getAttribute('sandbox')).toBe('');
    expect(frame.getAttribute('srcdoc')).toContain('<h1>Hello Dr Sana Scientist</h1>');
    expect(frame.getAttribute('srcdoc')).toContain('Content-Security-Policy');
    const warning = screen.getByRole('alert');
    expect(warning.textContent).toContain('Unknown personal fields');
    expect(warning.textContent).toContain('{{dipsCreditd}}');

    fireEvent.click(screen.getByRole('button', { name: 'Plain text' }));
    expect(screen.getByText(/Unsubscribe: http:\/\/x.test\/u/)).toBeTruthy();
    expect(screen.queryByTitle(/^Preview of/)).toBeNull();
  });

  it('inserts a personal field at the caret and saves the draft with the chosen audience', async () => {
    const sent = fakeApi();
    renderAt('/lab/newsletters/new');
    fireEvent.change(screen.getByLabelText('Headline'), { target: { value: '  Thanks  ' } });
    const body = screen.getByLabelText(/^Text/) as HTMLTextAreaElement;
    fireEvent.change(body, { target: { value: 'Hi , welcome' } });
    body.setSelectionRange(3, 3);
    fireEvent.click(screen.getByRole('button', { name: /^Insert \{\{displayName\}\}/ }));
    expect(body.value).toBe('Hi {{displayName}}, welcome');

    fireEvent.click(screen.getByLabelText('Opted in and active recently'));
    fireEvent.change(screen.getByLabelText(/Active in the last/), { target: { value: '14' } });
    const remote = screen.getByLabelText('Allow remote images') as HTMLInputElement;
    expect(remote.checked).toBe(false);
    fireEvent.click(screen.getByRole('button', { name: 'Save as draft' }));

    expect(await screen.findByText('Newsletter 9 opened')).toBeTruthy();
    expect(sent.find((s) => s.method === 'POST' && s.path === '/api/newsletters')?.body).toEqual({
      headline: 'Thanks',
      bodyMarkdown: 'Hi {{displayName}}, welcome',
      audience: { kind: 'active', days: 14 },
      allowRemoteImages: false,
    });
  });

  it('refuses to save without a headline or text, and names each field', async () => {
    const sent = fakeApi();
    renderAt('/lab/newsletters/new');
    fireEvent.click(screen.getByRole('button', { name: 'Save as draft' }));
    expect(await screen.findByText('Write a headline')).toBeTruthy();
    expect(screen.getByText('Write the newsletter')).toBeTruthy();
    expect(sent.some((s) => s.method === 'POST' && s.path === '/api/newsletters')).toBe(false);
  });
});

describe('one newsletter', () => {
  it('sends now only after the confirm, with an empty body, and tells how many people are in the audience', async () => {
    const sent = fakeApi({ list: [newsletter()] });
    renderAt('/lab/newsletters/5');
    fireEvent.click(await screen.findByRole('button', { name: 'Send now…' }));
    expect(sent.some((s) => s.path.endsWith('/send'))).toBe(false);
    expect(screen.getByText(/It goes to: Everyone who opted in — 12 people at the moment/)).toBeTruthy();
    fireEvent.click(screen.getByRole('button', { name: 'Yes, send it now' }));
    expect(await screen.findByText(/On its way to 42 people/)).toBeTruthy();
    expect(sent.find((s) => s.path === '/api/newsletters/5/send')?.body).toEqual({});
  });

  it('schedules at the chosen local time as an ISO instant and names the time zone', async () => {
    const sent = fakeApi({ list: [newsletter()] });
    renderAt('/lab/newsletters/5');
    const input = await screen.findByLabelText('Send at');
    expect(
      screen.getByText(`In your time zone: ${Intl.DateTimeFormat().resolvedOptions().timeZone}.`),
    ).toBeTruthy();
    const next = new Date();
    const local = `${next.getFullYear() + 1}-06-15T09:30`;
    fireEvent.change(input, { target: { value: local } });
    fireEvent.click(screen.getByRole('button', { name: 'Schedule' }));
    expect(await screen.findByText(/The audience holds 42 people now/)).toBeTruthy();
    expect(sent.find((s) => s.path === '/api/newsletters/5/send')?.body).toEqual({
      at: new Date(next.getFullYear() + 1, 5, 15, 9, 30).toISOString(),
    });
  });

  it('refuses a time in the past without asking the server', async () => {
    const sent = fakeApi({ list: [newsletter()] });
    renderAt('/lab/newsletters/5');
    fireEvent.change(await screen.findByLabelText('Send at'), { target: { value: '2020-01-01T10:00' } });
    fireEvent.click(screen.getByRole('button', { name: 'Schedule' }));
    expect(await screen.findByText(/Choose a time in the future/)).toBeTruthy();
    expect(sent.some((s) => s.path.endsWith('/send'))).toBe(false);
  });

  it('shows the server’s refusal when the newsletter was sent meanwhile', async () => {
    fakeApi({ list: [newsletter()], sendAnswer: 'conflict' });
    renderAt('/lab/newsletters/5');
    fireEvent.click(await screen.findByRole('button', { name: 'Send now…' }));
    fireEvent.click(screen.getByRole('button', { name: 'Yes, send it now' }));
    const alert = await screen.findByText('This newsletter is sent; it cannot be sent again');
    expect(alert.closest('[role="alert"]')?.textContent).toContain('Not sent');
  });

  it('sends a test copy and says where it went', async () => {
    const sent = fakeApi({ list: [newsletter()] });
    renderAt('/lab/newsletters/5');
    fireEvent.click(await screen.findByRole('button', { name: 'Send a test copy to me' }));
    expect(await screen.findByText('A test copy is on its way to sana@demo.test.')).toBeTruthy();
    expect(sent.some((s) => s.method === 'POST' && s.path === '/api/newsletters/5/test')).toBe(true);
  });

  it('shows progress while sending, unknown explained, and no send buttons', async () => {
    fakeApi({
      list: [
        newsletter({
          status: 'sending',
          lastError: 'SMTP said 421',
          progress: {
            recipients: 10,
            queued: 3,
            sending: 1,
            sent: 3,
            failed: 1,
            skippedUnsubscribed: 1,
            unknown: 1,
          },
        }),
      ],
    });
    renderAt('/lab/newsletters/5');
    const bar = await screen.findByRole('progressbar', { name: 'Readers handled' });
    expect(bar.getAttribute('aria-valuenow')).toBe('7');
    expect(bar.getAttribute('aria-valuemax')).toBe('10');
    expect(bar.getAttribute('aria-valuetext')).toBe('7 of 10 handled');
    const progress = screen.getByRole('region', { name: 'Progress' });
    const term = within(progress).getByText('Unknown');
    expect(term.parentElement?.textContent).toContain('1');
    expect(progress.textContent).toContain('we do not know whether these arrived');
    expect(progress.textContent).toContain('never sent again automatically');
    expect(within(progress).getByText('Skipped as unsubscribed').parentElement?.textContent).toContain('1');
    expect(screen.getByText('SMTP said 421')).toBeTruthy();
    expect(screen.queryByRole('button', { name: 'Send now…' })).toBeNull();
  });
});

describe('the list', () => {
  it('shows each newsletter with its status, audience, time and progress', async () => {
    fakeApi({
      list: [
        newsletter({
          id: 6,
          headline: 'Winter round-up',
          status: 'sent',
          sentAt: '2026-12-01T12:00:00.000Z',
          audience: { kind: 'active', days: 30 },
          progress: {
            recipients: 4,
            queued: 0,
            sending: 0,
            sent: 2,
            failed: 0,
            skippedUnsubscribed: 1,
            unknown: 1,
          },
        }),
        newsletter(),
      ],
    });
    renderAt('/lab/newsletters');
    const link = await screen.findByRole('link', { name: 'Winter round-up' });
    const row = link.closest('tr')!;
    expect(within(row).getByText('Sent', { selector: 'span' })).toBeTruthy();
    expect(within(row).getByText('Opted in and active in the last 30 days')).toBeTruthy();
    expect(within(row).getByRole('progressbar').getAttribute('aria-valuetext')).toBe('4 of 4 handled');
    expect(row.textContent).toContain('we do not know whether these arrived');
    const draftRow = screen.getByRole('link', { name: 'Sector 12 is done' }).closest('tr')!;
    expect(within(draftRow).getByText('Not sent yet.')).toBeTruthy();
  });

  it('invites writing the first one when there are none', async () => {
    fakeApi();
    renderAt('/lab/newsletters');
    expect(await screen.findByText('No newsletters yet')).toBeTruthy();
    expect(screen.getAllByRole('link', { name: 'Write a newsletter' }).length).toBeGreaterThan(0);
  });

  it('offers to try again when the list cannot be loaded', async () => {
    vi.stubGlobal(
      'fetch',
      vi.fn(async () => new Response('oops', { status: 500 })),
    );
    renderAt('/lab/newsletters');
    await waitFor(() => expect(screen.getByText('Could not load the newsletters')).toBeTruthy(), {
      timeout: 5000,
    });
    expect(screen.getByRole('button', { name: 'Try again' })).toBeTruthy();
  });
});
