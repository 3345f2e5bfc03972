// @vitest-environment jsdom
import { QueryClientProvider } from '@tanstack/react-query';
import { cleanup, fireEvent, render, screen, within } from '@testing-library/react';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import { afterEach, describe, expect, it } from 'vitest';
import { HomeRoute } from '@/app/routes/home';
import { RecordRoute } from '@/app/routes/record';
import { createQueryClient } from '@/lib/query-client';
import { queryKeys } from '@/lib/query-keys';
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

const emptyRecord = {
  verdicts: { total: 0, dip: 0, flat: 0, unsure: 0, last30Days: 0 },
  controls: {
    plantedSeen: 0,
    plantedFound: 0,
    quietSeen: 0,
    quietCorrect: 0,
    sensitivity: null,
    specificity: null,
  },
  dipsHelped: 0,
  candidatesCredited: 0,
  recent: [],
};

const correctPassword = 'the right password';

/** My record's server: the person (until deleted), an empty record, and DELETE /api/auth/me. */
function recordServer(person: Record<string, unknown>): FakeHandler {
  let deleted = false;
  return ({ method, path, body }) => {
    if (path === '/api/auth/me' && method === 'GET') {
      return deleted ? apiError(401, 'not_signed_in', 'Sign in first.') : json(200, { person });
    }
    if (path === '/api/record') return json(200, { record: emptyRecord });
    if (path === '/api/auth/me' && method === 'DELETE') {
      if ((body as { password?: string }).password !== correctPassword) {
        return apiError(400, 'invalid_input', 'Check the form.', { password: 'That is not your password.' });
      }
      deleted = true;
      return json(200, { deleted: true });
    }
    return undefined;
  };
}

let fake: FakeApi;

afterEach(() => {
  cleanup();
  fake.restore();
});

function renderRecord() {
  const client = createQueryClient();
  const router = createMemoryRouter(
    [
      { path: '/', Component: HomeRoute },
      { path: '/record', Component: RecordRoute },
      { path: '/sign-in', element: <p>Sign-in form</p> },
    ],
    { initialEntries: ['/record'] },
  );
  render(
    <QueryClientProvider client={client}>
      <RouterProvider router={router} />
    </QueryClientProvider>,
  );
  return { client, router };
}

describe('My record: delete my account', () => {
  it('says what goes and what stays, refuses a wrong password by the field, then deletes and goes home', async () => {
    fake = fakeApi(recordServer(fakePerson()));
    const { client, router } = renderRecord();
    const section = await screen.findByRole('region', { name: 'Delete my account' });
    expect(within(section).getByText(/your e-mail address/)).toBeTruthy();
    expect(within(section).getByText(/your display name/)).toBeTruthy();
    expect(within(section).getByText(/your sign-in/)).toBeTruthy();
    expect(within(section).getByText(/Your verdicts, without your name or address/)).toBeTruthy();

    fireEvent.click(within(section).getByRole('button', { name: 'Delete my account…' }));
    const form = within(section).getByRole('form', { name: 'Confirm deleting your account' });
    fireEvent.click(within(form).getByRole('button', { name: 'Delete my account for good' }));
    expect(within(form).getByText('Enter your password to confirm it is you.')).toBeTruthy();
    expect(fake.calls('DELETE', '/api/auth/me')).toHaveLength(0);

    fireEvent.change(within(form).getByLabelText('Your password'), { target: { value: 'a wrong one' } });
    fireEvent.click(within(form).getByRole('button', { name: 'Delete my account for good' }));
    expect(await within(form).findByText('That is not your password.')).toBeTruthy();
    expect(within(form).getByLabelText('Your password').getAttribute('aria-invalid')).toBe('true');
    expect(router.state.location.pathname).toBe('/record');

    fireEvent.change(within(form).getByLabelText('Your password'), { target: { value: correctPassword } });
    fireEvent.click(within(form).getByRole('button', { name: 'Delete my account for good' }));
    expect(await screen.findByText(/Your account is deleted and you are signed out/)).toBeTruthy();
    expect(router.state.location.pathname).toBe('/');
    expect(client.getQueryData(queryKeys.me())).toBeNull();
    expect(fake.calls('DELETE', '/api/auth/me').map((call) => call.body)).toEqual([
      { password: 'a wrong one' },
      { password: correctPassword },
    ]);
  });

  it('Keep my account closes the step without sending anything', async () => {
    fake = fakeApi(recordServer(fakePerson()));
    renderRecord();
    fireEvent.click(await screen.findByRole('button', { name: 'Delete my account…' }));
    fireEvent.click(screen.getByRole('button', { name: 'Keep my account' }));
    expect(screen.queryByRole('form', { name: 'Confirm deleting your account' })).toBeNull();
    expect(document.activeElement?.textContent).toBe('Delete my account…');
    expect(fake.calls('DELETE', '/api/auth/me')).toHaveLength(0);
  });
});

describe('My record: address confirmation', () => {
  it('while the address is unconfirmed, offers to send the link again and shows the server answer', async () => {
    fake = fakeApi(recordServer(fakePerson({ emailConfirmed: false })), ({ method, path }) =>
      method === 'POST' && path === '/api/auth/confirm-email/resend'
        ? json(202, { message: 'A new link is on its way to ada@example.com.' })
        : undefined,
    );
    renderRecord();
    expect(await screen.findByText('Your address is not confirmed yet')).toBeTruthy();
    fireEvent.click(screen.getByRole('button', { name: 'Send the link again' }));
    expect(await screen.findByText('A new link is on its way to ada@example.com.')).toBeTruthy();
    expect(fake.calls('POST', '/api/auth/confirm-email/resend')).toHaveLength(1);
  });

  it('once the address is confirmed, shows no such note', async () => {
    fake = fakeApi(recordServer(fakePerson({ emailConfirmed: true })));
    renderRecord();
    await screen.findByRole('region', { name: 'Delete my account' });
    expect(screen.queryByText('Your address is not confirmed yet')).toBeNull();
    expect(screen.queryByRole('button', { name: 'Send the link again' })).toBeNull();
  });
});
