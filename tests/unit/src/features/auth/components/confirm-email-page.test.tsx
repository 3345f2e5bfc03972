// @vitest-environment jsdom
import { QueryClientProvider } from '@tanstack/react-query';
import { cleanup, render, screen } from '@testing-library/react';
import { StrictMode } from 'react';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import { afterEach, describe, expect, it } from 'vitest';
import { ConfirmEmailRoute } from '@/app/routes/account-links';
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

let fake: FakeApi;

afterEach(() => {
  cleanup();
  fake.restore();
});

const unconfirmed = fakePerson({ emailConfirmed: false });

function signedInAs(person: unknown): FakeHandler {
  return ({ path }) => (path === '/api/auth/me' ? json(200, { person }) : undefined);
}

/** Rendered in StrictMode, as the app is in development, where React runs each effect twice. */
function renderAt(path: string) {
  const client = createQueryClient();
  const router = createMemoryRouter([{ path: '/confirm-email', Component: ConfirmEmailRoute }], {
    initialEntries: [path],
  });
  render(
    <StrictMode>
      <QueryClientProvider client={client}>
        <RouterProvider router={router} />
      </QueryClientProvider>
    </StrictMode>,
  );
  return client;
}

describe('Address confirmation page', () => {
  it('posts the token once, even in StrictMode, says the address is confirmed and refreshes the person', async () => {
    fake = fakeApi(signedInAs(unconfirmed), ({ method, path }) =>
      method === 'POST' && path === '/api/auth/confirm-email'
        ? json(200, { person: { ...unconfirmed, emailConfirmed: true } })
        : undefined,
    );
    const client = renderAt('/confirm-email?token=t0k3n');
    expect(await screen.findByText('Your address is confirmed')).toBeTruthy();
    const posts = fake.calls('POST', '/api/auth/confirm-email');
    expect(posts).toHaveLength(1);
    expect(posts[0]!.body).toEqual({ token: 't0k3n' });
    expect(client.getQueryData<{ emailConfirmed: boolean }>(queryKeys.me())?.emailConfirmed).toBe(true);
    expect(screen.getByRole('link', { name: 'Open My record' }).getAttribute('href')).toBe('/record');
  });

  it('when the token expired or was used, says so and where to ask for a new link', async () => {
    fake = fakeApi(
      ({ path }) => (path === '/api/auth/me' ? apiError(401, 'not_signed_in', 'Sign in first.') : undefined),
      ({ path }) =>
        path === '/api/auth/confirm-email'
          ? apiError(400, 'token_invalid', 'This link has expired or was already used.', {
              token: 'This link has expired or was already used.',
            })
          : undefined,
    );
    renderAt('/confirm-email?token=old');
    expect(await screen.findByText('This link no longer works')).toBeTruthy();
    expect(screen.getByText(/Sign in and ask for a new link on My record/)).toBeTruthy();
    expect(screen.queryByText('Your address is confirmed')).toBeNull();
    expect(fake.calls('POST', '/api/auth/confirm-email')).toHaveLength(1);
  });

  it('without a token in the address, posts nothing', async () => {
    fake = fakeApi(signedInAs(unconfirmed));
    renderAt('/confirm-email');
    expect(await screen.findByText('This link is incomplete')).toBeTruthy();
    expect(fake.calls('POST', '/api/auth/confirm-email')).toHaveLength(0);
  });
});
