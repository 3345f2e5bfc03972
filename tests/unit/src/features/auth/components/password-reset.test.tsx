// @vitest-environment jsdom
import { QueryClientProvider } from '@tanstack/react-query';
import { cleanup, fireEvent, render, screen } from '@testing-library/react';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import { afterEach, describe, expect, it } from 'vitest';
import { PasswordResetConfirmRoute, PasswordResetRoute } from '@/app/routes/account-links';
import { SignInRoute } from '@/app/routes/sign-in';
import { createQueryClient } from '@/lib/query-client';
import { apiError, type FakeApi, fakeApi, json } from '../../../support/fake-api';

// What Testing Library sets itself when the test runner has global hooks (ours are imported).
(globalThis as { IS_REACT_ACT_ENVIRONMENT?: boolean }).IS_REACT_ACT_ENVIRONMENT = true;

const accepted = 'If that address has an account, a link to choose a new password is on its way.';

let fake: FakeApi;

afterEach(() => {
  cleanup();
  fake.restore();
});

const signedOut = () => apiError(401, 'not_signed_in', 'Sign in first.');

function renderAt(path: string) {
  const router = createMemoryRouter(
    [
      { path: '/sign-in', Component: SignInRoute },
      { path: '/password-reset', Component: PasswordResetRoute },
      { path: '/password-reset/confirm', Component: PasswordResetConfirmRoute },
    ],
    { initialEntries: [path] },
  );
  render(
    <QueryClientProvider client={createQueryClient()}>
      <RouterProvider router={router} />
    </QueryClientProvider>,
  );
  return router;
}

function typeInto(label: string, value: string) {
  fireEvent.change(screen.getByLabelText(label), { target: { value } });
}

describe('Sign in', () => {
  it('links to the password reset', async () => {
    fake = fakeApi(({ path }) => (path === '/api/auth/me' ? signedOut() : undefined));
    renderAt('/sign-in');
    const link = await screen.findByRole('link', { name: 'Forgot your password?' });
    expect(link.getAttribute('href')).toBe('/password-reset');
  });
});

describe('Password reset request', () => {
  it('shows the server message for any address, known or not, and says nothing else about the account', async () => {
    fake = fakeApi(({ method, path }) =>
      method === 'POST' && path === '/api/auth/password-reset' ? json(202, { message: accepted }) : undefined,
    );
    renderAt('/password-reset');
    typeInto('E-mail', 'nobody@example.com');
    fireEvent.click(screen.getByRole('button', { name: 'Send the link' }));
    expect(await screen.findByText(accepted)).toBeTruthy();
    expect(fake.calls('POST', '/api/auth/password-reset')[0]!.body).toEqual({ email: 'nobody@example.com' });
    expect(screen.queryByText(/no account|not found|unknown/i)).toBeNull();

    typeInto('E-mail', ' ada@example.com ');
    fireEvent.click(screen.getByRole('button', { name: 'Send another link' }));
    await screen.findByRole('button', { name: 'Send another link' });
    expect(fake.calls('POST', '/api/auth/password-reset')[1]!.body).toEqual({ email: 'ada@example.com' });
    expect(screen.getAllByText(accepted)).toHaveLength(1);
  });

  it('asks for an address before sending anything, and shows the server field error by the field', async () => {
    fake = fakeApi(({ method, path }) =>
      method === 'POST' && path === '/api/auth/password-reset'
        ? apiError(400, 'invalid_input', 'Check the form.', { email: 'Enter a valid e-mail address.' })
        : undefined,
    );
    renderAt('/password-reset');
    fireEvent.click(screen.getByRole('button', { name: 'Send the link' }));
    expect(screen.getByText('Enter the e-mail address you signed up with.')).toBeTruthy();
    expect(fake.requests).toHaveLength(0);

    typeInto('E-mail', 'ada@');
    fireEvent.click(screen.getByRole('button', { name: 'Send the link' }));
    expect(await screen.findByText('Enter a valid e-mail address.')).toBeTruthy();
    expect(screen.getByLabelText('E-mail').getAttribute('aria-invalid')).toBe('true');
  });

  it('when asked too often, shows the server message', async () => {
    fake = fakeApi(({ path }) =>
      path === '/api/auth/password-reset'
        ? apiError(429, 'too_many_requests', 'Too many reset requests; try again in an hour.')
        : undefined,
    );
    renderAt('/password-reset');
    typeInto('E-mail', 'ada@example.com');
    fireEvent.click(screen.getByRole('button', { name: 'Send the link' }));
    expect((await screen.findByRole('alert')).textContent).toBe(
      'Too many reset requests; try again in an hour.',
    );
  });
});

describe('Password reset confirm', () => {
  it('checks the two passwords match before sending them', async () => {
    fake = fakeApi();
    renderAt('/password-reset/confirm?token=abc');
    typeInto('New password', 'a long new password');
    typeInto('New password again', 'a long new passw0rd');
    fireEvent.click(screen.getByRole('button', { name: 'Save the new password' }));
    expect(screen.getByText('The two passwords are not the same.')).toBeTruthy();
    expect(fake.requests).toHaveLength(0);
  });

  it('shows the server password rule by the field', async () => {
    fake = fakeApi(({ path }) =>
      path === '/api/auth/password-reset/confirm'
        ? apiError(400, 'invalid_input', 'Check the form.', { password: 'This password is too common.' })
        : undefined,
    );
    renderAt('/password-reset/confirm?token=abc');
    typeInto('New password', 'password1234');
    typeInto('New password again', 'password1234');
    fireEvent.click(screen.getByRole('button', { name: 'Save the new password' }));
    expect(await screen.findByText('This password is too common.')).toBeTruthy();
    expect(screen.getByLabelText('New password').getAttribute('aria-invalid')).toBe('true');
  });

  it('when the link expired or was used, says so and links to ask for a new one', async () => {
    fake = fakeApi(({ path }) =>
      path === '/api/auth/password-reset/confirm'
        ? apiError(400, 'token_invalid', 'This link has expired or was already used.', {
            token: 'This link has expired or was already used.',
          })
        : undefined,
    );
    renderAt('/password-reset/confirm?token=old%2Ftoken');
    typeInto('New password', 'a long new password');
    typeInto('New password again', 'a long new password');
    fireEvent.click(screen.getByRole('button', { name: 'Save the new password' }));
    expect(await screen.findByText('This link no longer works')).toBeTruthy();
    expect(fake.calls('POST', '/api/auth/password-reset/confirm')[0]!.body).toEqual({
      token: 'old/token',
      password: 'a long new password',
    });
    expect(screen.getByRole('link', { name: 'Ask for a new link' }).getAttribute('href')).toBe(
      '/password-reset',
    );
  });

  it('on success, says every session ended and links to sign in', async () => {
    fake = fakeApi(({ path }) =>
      path === '/api/auth/password-reset/confirm' ? json(200, { ok: true }) : undefined,
    );
    renderAt('/password-reset/confirm?token=abc');
    typeInto('New password', 'a long new password');
    typeInto('New password again', 'a long new password');
    fireEvent.click(screen.getByRole('button', { name: 'Save the new password' }));
    expect(
      await screen.findByText('You are signed out everywhere; sign in with the new password.'),
    ).toBeTruthy();
    expect(screen.getByRole('link', { name: 'Sign in' }).getAttribute('href')).toBe('/sign-in');
  });

  it('without a token in the address, offers to ask for a new link', () => {
    fake = fakeApi();
    renderAt('/password-reset/confirm');
    expect(screen.getByText('This link is incomplete')).toBeTruthy();
    expect(screen.getByRole('link', { name: 'ask for a new link' }).getAttribute('href')).toBe(
      '/password-reset',
    );
  });
});
