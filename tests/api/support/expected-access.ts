import type { Access } from '../../../server/http/define-route';

/** A route as the route table names it: the method in capitals and the path under /api. */
export const routeKey = (method: string, path: string): string => `${method.toUpperCase()} ${path}`;

/**
 * Who should reach each API route, written from the product's rules rather than copied from the
 * route table: visitors the Deck and their own sign-in; volunteers their account and record;
 * moderators the Desk (splits, rulings, the volunteer audit and the audit log); scientists the Lab
 * (campaigns, targets, snippets, candidates, exports, newsletters, API tokens); admins everything,
 * and alone the people, the outbox and the queues. tests/api/authorisation-matrix.test.ts holds
 * the route table to this list both ways, so a new route or a changed rule has to be written here.
 */
export const EXPECTED_ACCESS: Record<string, Access> = {
  'GET /health': 'public',
  'GET /openapi.json': 'public',

  // Signing up, in and out, and the links mailed to a person, work signed out.
  'GET /auth/csrf': 'public',
  'POST /auth/sign-up': 'public',
  'POST /auth/sign-in': 'public',
  'POST /auth/sign-out': 'public',
  'POST /auth/password-reset': 'public',
  'POST /auth/password-reset/confirm': 'public',
  'POST /auth/confirm-email': 'public',
  'GET /unsubscribe': 'public',
  'POST /unsubscribe': 'public',
  // A suspended person still reads and changes their own account, and may delete it.
  'GET /auth/me': 'signed-in',
  'PATCH /auth/me': 'signed-in',
  'DELETE /auth/me': 'signed-in',
  'POST /auth/confirm-email/resend': 'signed-in',
  'GET /record': 'signed-in',

  // Visitors judge too (up to the guest limit); a suspended account is refused by the handler.
  'GET /deck/next': 'public',
  'POST /verdicts': 'public',
  'DELETE /verdicts/:clientId': 'public',

  'GET /desk/splits': 'moderator',
  'GET /desk/splits/:id': 'moderator',
  'POST /snippets/:id/ruling': 'moderator',
  'GET /desk/volunteers': 'moderator',
  'POST /desk/volunteers/:id/suspend': 'moderator',
  'POST /desk/volunteers/:id/restore': 'moderator',
  'POST /desk/volunteers/:id/flags/:code/clear': 'moderator',
  'POST /desk/volunteers/:id/warning': 'moderator',
  'GET /audit': 'moderator',
  // Any staff member follows the jobs they started; the service refuses anyone else's (not_your_job).
  // Only Lab actions start jobs today, so for a moderator this answers nothing but refusals.
  'GET /jobs/:id': 'moderator',

  'GET /campaigns': 'scientist',
  'POST /campaigns': 'scientist',
  'GET /campaigns/:id': 'scientist',
  'PATCH /campaigns/:id': 'scientist',
  'GET /campaigns/:id/completeness': 'scientist',
  'POST /campaigns/:id/targets': 'scientist',
  'GET /campaigns/:id/targets': 'scientist',
  'POST /campaigns/:id/light-curves': 'scientist',
  'GET /campaigns/:id/uploads': 'scientist',
  'GET /uploads/:id': 'scientist',
  'GET /campaigns/:id/snippets': 'scientist',
  'GET /snippets/:id': 'scientist',
  'POST /snippets/:id/quiet': 'scientist',
  'GET /targets/:id': 'scientist',
  'GET /targets/:id/vetting': 'scientist',
  'GET /targets/:id/period-search': 'scientist',
  'POST /targets/:id/period-search': 'scientist',
  'GET /campaigns/:id/dip-targets': 'scientist',
  'POST /campaigns/:id/candidates': 'scientist',
  'GET /campaigns/:id/candidates': 'scientist',
  'GET /candidates/:id': 'scientist',
  'PATCH /candidates/:id': 'scientist',
  'GET /candidates/:id/windows': 'scientist',
  'GET /observatories': 'scientist',
  'POST /observatories': 'scientist',
  'PATCH /observatories/:id': 'scientist',
  'DELETE /observatories/:id': 'scientist',
  'GET /campaigns/:id/follow-up': 'scientist',
  'GET /campaigns/:id/consensus': 'scientist',
  'GET /newsletters': 'scientist',
  'POST /newsletters': 'scientist',
  'POST /newsletters/preview': 'scientist',
  'GET /newsletters/:id': 'scientist',
  'POST /newsletters/:id/test': 'scientist',
  'POST /newsletters/:id/send': 'scientist',
  'GET /tokens': 'scientist',
  'POST /tokens': 'scientist',
  'DELETE /tokens/:id': 'scientist',

  'GET /admin/people': 'admin',
  'PATCH /admin/people/:id': 'admin',
  'GET /admin/outbox': 'admin',
  'GET /admin/outbox/:id': 'admin',
  'GET /admin/queues': 'admin',
  'GET /admin/jobs': 'admin',
  'POST /admin/jobs/:id/retry': 'admin',
};

/**
 * Public routes whose handler refuses a suspended account (403 account_suspended): a suspended
 * person's verdicts must not count, and they cannot pass as a visitor while signed in.
 */
export const REFUSES_SUSPENDED: ReadonlySet<string> = new Set([
  'POST /verdicts',
  'DELETE /verdicts/:clientId',
]);
