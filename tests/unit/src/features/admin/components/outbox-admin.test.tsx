// @vitest-environment jsdom
import { QueryClientProvider } from '@tanstack/react-query';
import { cleanup, fireEvent, render, screen, within } from '@testing-library/react';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import { afterEach, describe, expect, it } from 'vitest';
import { AdminOutboxMessageRoute, AdminOutboxRoute, AdminRoute } from '@/app/routes/admin';
import { createQueryClient } from '@/lib/query-client';
import {
  apiError,
  type FakeApi,
  type FakeHandler,
  fakeApi,
  fakePerson,
  json,
} from '../../../support/fake-api';

// What Testing Library sets itself when the test runner has global hooks (ours are imported).
(globalThis as { IS_REACT_ACT_ENVIRONMENT?: boolean }).IS_REACT_ACT_ENVIRONMENT = true;

const admin = fakePerson({ id: 1, role: 'admin', displayName: 'Test Admin' });

function summary(id: number) {
  return {
    id,
    messageId: `<m${id}@dipdeck.test>`,
    from: 'Dipdeck <mail@dipdeck.test>',
    to: [`reader${id}@example.com`],
    subject: `Message ${id}`,
    receivedAt: '2026-12-02T10:15:00.000Z',
    sizeBytes: 1000 + id,
  };
}

const html = '<p>Dear reader, <a href="https://dipdeck.test/x">confirm</a></p><script>alert(1)</script>';

function fullMessage(id: number, parts: { html?: string | null; text?: string | null } = {}) {
  return {
    ...summary(id),
    headers: [
      { key: 'Received', value: 'from worker by catcher; Wed, 2 Dec 2026 10:15:00 +0000' },
      { key: 'Received', value: 'from app by worker; Wed, 2 Dec 2026 10:14:59 +0000' },
      { key: 'Subject', value: `Message ${id}` },
      { key: 'List-Unsubscribe-Post', value: 'List-Unsubscribe=One-Click' },
    ],
    text: 'Dear reader,\n\n  confirm here: https://dipdeck.test/x',
    html,
    ...parts,
  };
}

/** The outbox as the server would answer: `count` messages numbered from the newest down. */
function outboxHandler(count: number): FakeHandler {
  const ids = Array.from({ length: count }, (_, i) => count - i);
  return ({ method, path, query }) => {
    if (method !== 'GET') return undefined;
    if (path === '/api/auth/me') return json(200, { person: admin });
    if (path === '/api/admin/outbox') {
      const limit = Number(query.get('limit'));
      const offset = Number(query.get('offset'));
      return json(200, { messages: ids.slice(offset, offset + limit).map(summary), total: count });
    }
    const one = path.match(/^\/api\/admin\/outbox\/(\d+)$/);
    if (one) {
      const id = Number(one[1]);
      if (!ids.includes(id)) return apiError(404, 'not_found', 'No message with this id.');
      return json(200, { message: fullMessage(id) });
    }
    return undefined;
  };
}

let fake: FakeApi;

afterEach(() => {
  cleanup();
  fake.restore();
});

function renderAdmin(path: string) {
  const router = createMemoryRouter(
    [
      {
        path: '/admin',
        Component: AdminRoute,
        children: [
          { path: '/admin/outbox', Component: AdminOutboxRoute },
          { path: '/admin/outbox/:messageId', Component: AdminOutboxMessageRoute },
        ],
      },
    ],
    { initialEntries: [path] },
  );
  const client = createQueryClient();
  // The app asks again after a server error; the test wants the first failure on screen at once.
  client.setQueryDefaults(['outbox'], { retry: false });
  render(
    <QueryClientProvider client={client}>
      <RouterProvider router={router} />
    </QueryClientProvider>,
  );
  return router;
}

describe('Admin outbox list', () => {
  it('lists each message with its sender, recipients, time and size, and links to it', async () => {
    fake = fakeApi(outboxHandler(3));
    renderAdmin('/admin/outbox');
    const table = await screen.findByRole('table', { name: /newest first/ });
    const rows = within(table).getAllByRole('row').slice(1);
    expect(rows.map((row) => within(row).getByRole('link').textContent)).toEqual([
      'Message 3',
      'Message 2',
      'Message 1',
    ]);
    expect(within(rows[0]!).getByText('reader3@example.com')).toBeTruthy();
    expect(within(rows[0]!).getByText('Dipdeck <mail@dipdeck.test>')).toBeTruthy();
    expect(within(rows[0]!).getByText('1 kB')).toBeTruthy();
    expect(within(rows[0]!).getByRole('link').getAttribute('href')).toBe('/admin/outbox/3');
    expect(fake.calls('GET', '/api/admin/outbox')[0]!.query.toString()).toBe('limit=50&offset=0');
    expect(screen.getByRole('link', { name: 'Outbox' }).getAttribute('aria-current')).toBe('page');
  });

  it('the pager asks the server for the next fifty and keeps the page in the address', async () => {
    fake = fakeApi(outboxHandler(60));
    const router = renderAdmin('/admin/outbox');
    await screen.findByText('Message 60');
    expect(screen.getByText('of', { exact: false }).textContent).toContain('60');
    fireEvent.click(screen.getByRole('button', { name: 'Next' }));
    await screen.findByText('Message 10');
    expect(screen.queryByText('Message 60')).toBeNull();
    expect(fake.calls('GET', '/api/admin/outbox').at(-1)!.query.get('offset')).toBe('50');
    expect(router.state.location.search).toBe('?page=2');
  });

  it('with no mail yet, says so and says what will appear', async () => {
    fake = fakeApi(outboxHandler(0));
    renderAdmin('/admin/outbox');
    expect(
      await screen.findByText(
        'No mail has been sent yet. Dipdeck keeps every message its local mail catcher receives here.',
      ),
    ).toBeTruthy();
    expect(screen.queryByRole('table')).toBeNull();
  });

  it('when the list cannot be read, shows the server message and Try again reads it again', async () => {
    let failing = true;
    fake = fakeApi(
      ({ path }) =>
        path === '/api/admin/outbox' && failing
          ? apiError(503, 'mail_catcher_unavailable', 'The mail catcher is not running.')
          : undefined,
      outboxHandler(2),
    );
    renderAdmin('/admin/outbox');
    expect(await screen.findByText('The mail catcher is not running.')).toBeTruthy();
    failing = false;
    fireEvent.click(screen.getByRole('button', { name: 'Try again' }));
    expect(await screen.findByText('Message 2')).toBeTruthy();
  });
});

describe('Admin outbox: one message', () => {
  it('shows the HTML in an iframe sandboxed with no permissions, behind a policy that loads nothing remote', async () => {
    fake = fakeApi(outboxHandler(3));
    renderAdmin('/admin/outbox/2');
    expect(await screen.findByRole('heading', { level: 1, name: 'Message 2' })).toBeTruthy();
    const frame = screen.getByTitle('The HTML of “Message 2”') as HTMLIFrameElement;
    expect(frame.tagName).toBe('IFRAME');
    expect(frame.getAttribute('sandbox')).toBe('');
    const srcdoc = frame.getAttribute('srcdoc') ?? '';
    expect(srcdoc).toContain(html);
    expect(srcdoc.indexOf('Content-Security-Policy')).toBeLessThan(srcdoc.indexOf(html));
    expect(screen.getByText(/Links and images are not loaded here/)).toBeTruthy();
    expect(screen.getByRole('button', { name: 'HTML' }).getAttribute('aria-pressed')).toBe('true');
  });

  it('Plain text shows the text with its line breaks kept; Headers lists every header line in order', async () => {
    fake = fakeApi(outboxHandler(3));
    renderAdmin('/admin/outbox/2');
    fireEvent.click(await screen.findByRole('button', { name: 'Plain text' }));
    const text = screen.getByText(/confirm here/);
    expect(text.tagName).toBe('PRE');
    expect(text.textContent).toBe('Dear reader,\n\n  confirm here: https://dipdeck.test/x');
    expect(screen.queryByTitle(/The HTML of/)).toBeNull();

    fireEvent.click(screen.getByRole('button', { name: 'Headers' }));
    const table = screen.getByRole('table', { name: /header lines/ });
    const rows = within(table)
      .getAllByRole('row')
      .slice(1)
      .map((row) =>
        within(row)
          .getAllByRole('cell')
          .map((cell) => cell.textContent),
      );
    expect(rows).toEqual([
      ['Received', 'from worker by catcher; Wed, 2 Dec 2026 10:15:00 +0000'],
      ['Received', 'from app by worker; Wed, 2 Dec 2026 10:14:59 +0000'],
      ['Subject', 'Message 2'],
      ['List-Unsubscribe-Post', 'List-Unsubscribe=One-Click'],
    ]);
  });

  it('a message without HTML opens on its plain text', async () => {
    fake = fakeApi(
      ({ path }) =>
        path === '/api/admin/outbox/5' ? json(200, { message: fullMessage(5, { html: null }) }) : undefined,
      outboxHandler(5),
    );
    renderAdmin('/admin/outbox/5');
    expect((await screen.findByText(/confirm here/)).tagName).toBe('PRE');
    expect(screen.getByRole('button', { name: 'Plain text' }).getAttribute('aria-pressed')).toBe('true');
    fireEvent.click(screen.getByRole('button', { name: 'HTML' }));
    expect(screen.getByText(/This message has no HTML part/)).toBeTruthy();
    expect(screen.queryByTitle(/The HTML of/)).toBeNull();
  });

  it('a message that is not there says so and links back to the outbox', async () => {
    fake = fakeApi(outboxHandler(3));
    renderAdmin('/admin/outbox/99');
    expect(await screen.findByText('No such message')).toBeTruthy();
    expect(screen.getByRole('link', { name: 'Open the outbox' }).getAttribute('href')).toBe('/admin/outbox');
  });
});
