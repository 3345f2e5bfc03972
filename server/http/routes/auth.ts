import type { Request } from 'express';
import { z } from 'zod';
import { enqueue } from '../../../worker/queues';
import { csrf } from '../../auth/csrf';
import type { PersonRow } from '../../db/people';
import { AppError } from '../../errors';
import {
  confirmAddress,
  deleteOwnAccount,
  requestPasswordReset,
  resendAddressConfirmation,
  resetPassword,
} from '../../services/auth/account-mail';
import { signUp } from '../../services/auth/sign-up';
import { claimGuestVerdicts } from '../../services/deck/verdicts';
import { toPersonView } from '../../services/people/person-view';
import { updateOwnAccount } from '../../services/people/update-own-account';
import type { AppDeps } from '../app-deps';
import { defineRoute } from '../define-route';
import { hashedAddress } from '../rate-limits';

const email = z.email('Enter a valid e-mail address').max(254, 'At most 254 characters');

const signUpBody = z.object({
  email,
  displayName: z
    .string('Enter a display name')
    .trim()
    .min(1, 'Enter a display name')
    .max(80, 'At most 80 characters'),
  password: z
    .string('Enter a password')
    .min(10, 'Use at least 10 characters')
    .max(1024, 'At most 1024 characters'),
  newsletterOptIn: z.boolean().default(false),
});

const ownAccountChange = z
  .object({
    displayName: signUpBody.shape.displayName.optional(),
    newsletterOptIn: z.boolean().optional(),
    creditByName: z.boolean().optional(),
  })
  .strict()
  .refine((change) => Object.keys(change).length > 0, { message: 'Give at least one change', path: ['_'] });

const password = signUpBody.shape.password;
const token = z.string('The link has no token').min(20, 'The link is not whole').max(200);

const signInBody = z.object({
  email: z.string('Enter your e-mail address').trim().min(1, 'Enter your e-mail address').max(254),
  password: z.string('Enter your password').min(1, 'Enter your password').max(1024),
});

// passport 0.7 regenerates the session on login (a new id: no session fixation) and keeps nothing
// of the old one, so the client fetches a new CSRF token afterwards.
// A visitor's guest verdicts come with them into their account (the session they were kept in is new).
async function logIn(req: Request, person: PersonRow, deps: AppDeps): Promise<void> {
  const guestKey = req.session.guestKey;
  await new Promise<void>((resolve, reject) =>
    req.login(person, (error) => (error ? reject(error) : resolve())),
  );
  if (guestKey) await claimGuestVerdicts(deps.db, guestKey, person.id);
}

function authenticate(req: Request, deps: AppDeps): Promise<PersonRow> {
  return new Promise((resolve, reject) => {
    deps.passport.authenticate('local', { session: false }, (error: unknown, person: PersonRow | false) => {
      if (error) reject(error);
      else if (!person) reject(new Error('passport-local answered no person and no error'));
      else resolve(person);
    })(req, req.res!, reject);
  });
}

// A security event: which address failed is logged as a hash, so that repeated attempts on one
// account can be told apart in the log without the log holding the addresses people typed.
function logSignInFailure(req: Request, deps: AppDeps, email: string, error: unknown): void {
  const code = error instanceof AppError ? error.code : 'error';
  deps.logger.warn(
    { event: 'sign_in_failed', reason: code, ip: req.ip, address: hashedAddress(email) },
    'sign-in failed',
  );
}

export const authRoutes = (deps: AppDeps) => [
  defineRoute({
    method: 'get',
    path: '/auth/csrf',
    access: 'public',
    summary: 'A CSRF token for this session, to send as X-CSRF-Token on state-changing requests',
    handle: async ({ req }) => ({ token: csrf.generateToken(req) }),
  }),
  defineRoute({
    method: 'post',
    path: '/auth/sign-up',
    access: 'public',
    summary: 'Create a volunteer account and sign in',
    before: [deps.rateLimits.signUpPerIp],
    body: signUpBody,
    status: 201,
    handle: async ({ req, body }) => {
      const person = await signUp(deps.db, body);
      await logIn(req, person, deps);
      // The confirmation link goes by the mail queue; an account works before it is confirmed.
      if (deps.queues) await enqueue(deps.queues, 'mail', 'confirm-address', { personId: person.id });
      return { person: toPersonView(person) };
    },
  }),
  defineRoute({
    method: 'post',
    path: '/auth/sign-in',
    access: 'public',
    summary: 'Sign in with e-mail and password',
    body: signInBody,
    before: [
      deps.rateLimits.signInPerIp,
      deps.rateLimits.signInPerAddress,
      deps.rateLimits.signInPerAddressAndIp,
    ],
    handle: async ({ req, body }) => {
      req.body = body; // passport-local reads the trimmed values
      const person = await authenticate(req, deps).catch((error: unknown) => {
        logSignInFailure(req, deps, body.email, error);
        throw error;
      });
      await logIn(req, person, deps);
      return { person: toPersonView(person) };
    },
  }),
  defineRoute({
    method: 'post',
    path: '/auth/sign-out',
    access: 'public',
    summary: 'Sign out and end this session',
    handle: async ({ req, res }) => {
      await new Promise<void>((resolve, reject) =>
        req.logout((error) => (error ? reject(error) : resolve())),
      );
      await new Promise<void>((resolve) => req.session.destroy(() => resolve()));
      res.clearCookie(deps.sessionCookie, { path: '/' });
    },
  }),
  defineRoute({
    method: 'get',
    path: '/auth/me',
    access: 'signed-in',
    summary: 'The signed-in person',
    handle: async ({ person }) => ({ person: toPersonView(person!) }),
  }),
  defineRoute({
    method: 'patch',
    path: '/auth/me',
    access: 'signed-in',
    summary: 'Change your display name, newsletter opt-in, or whether you are named on candidates',
    body: ownAccountChange,
    handle: async ({ person, body }) => ({
      person: toPersonView(await updateOwnAccount(deps.db, person!.id, body)),
    }),
  }),
  defineRoute({
    method: 'delete',
    path: '/auth/me',
    access: 'signed-in',
    summary:
      'Delete your account: e-mail, name and sign-in go, verdicts stay anonymously; needs your password',
    body: z.object({ password: z.string('Enter your password').min(1, 'Enter your password').max(1024) }),
    handle: async ({ req, res, person, body }) => {
      const answer = await deleteOwnAccount(deps.db, person!, body.password);
      await new Promise<void>((resolve) => req.logout(() => resolve()));
      await new Promise<void>((resolve) => req.session.destroy(() => resolve()));
      res.clearCookie(deps.sessionCookie, { path: '/' });
      return answer;
    },
  }),
  defineRoute({
    method: 'post',
    path: '/auth/password-reset',
    access: 'public',
    summary:
      'Ask for a password-reset link; the answer is the same whether or not an account has the address',
    body: z.object({ email }),
    status: 202,
    before: [deps.rateLimits.passwordResetPerIp, deps.rateLimits.passwordResetPerAddress],
    handle: ({ body }) => requestPasswordReset(deps.queues, body.email),
  }),
  defineRoute({
    method: 'post',
    path: '/auth/password-reset/confirm',
    access: 'public',
    summary:
      'Choose a new password with a reset link’s token (single use, 1 h); every session of the account ends',
    body: z.object({ token, password }),
    before: [deps.rateLimits.emailTokenFailuresPerIp],
    handle: ({ body }) => resetPassword(deps.db, body.token, body.password),
  }),
  defineRoute({
    method: 'post',
    path: '/auth/confirm-email',
    access: 'public',
    summary: 'Confirm an e-mail address with the token from the confirmation mail (valid 24 h)',
    body: z.object({ token }),
    before: [deps.rateLimits.emailTokenFailuresPerIp],
    handle: async ({ body }) => ({ person: toPersonView(await confirmAddress(deps.db, body.token)) }),
  }),
  defineRoute({
    method: 'post',
    path: '/auth/confirm-email/resend',
    access: 'signed-in',
    summary: 'Send the address-confirmation link again',
    status: 202,
    before: [deps.rateLimits.confirmationResendPerPerson],
    handle: ({ person }) => resendAddressConfirmation(deps.queues, person!),
  }),
];
