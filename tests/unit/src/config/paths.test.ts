import { describe, expect, it } from 'vitest';
import { apiPaths, paths, safeRedirect } from '@/config/paths';

describe('safeRedirect', () => {
  it('when the target is a path on this site, returns it', () => {
    expect(safeRedirect('/admin?q=ada', '/deck')).toBe('/admin?q=ada');
  });

  it('when the target is another origin or protocol-relative, returns the fallback', () => {
    expect(safeRedirect('https://elsewhere.example/', '/deck')).toBe('/deck');
    expect(safeRedirect('//elsewhere.example/', '/deck')).toBe('/deck');
    expect(safeRedirect(null, '/deck')).toBe('/deck');
  });
});

describe('paths', () => {
  it('carries the page to return to in the sign-in link', () => {
    expect(paths.signIn.getHref('/desk')).toBe('/sign-in?redirectTo=%2Fdesk');
    expect(paths.signIn.getHref()).toBe('/sign-in');
  });
});

describe('apiPaths', () => {
  it('keeps a job id, which names its queue after a colon, in one path segment', () => {
    expect(apiPaths.retryJob('mail:12')).toBe('/api/admin/jobs/mail%3A12/retry');
    expect(apiPaths.retryJob('a/b')).toBe('/api/admin/jobs/a%2Fb/retry');
  });
});

describe('Lab paths', () => {
  it('opens the snippet browser filtered to one target, with the designation encoded', () => {
    expect(paths.labSnippets.getHref(4)).toBe('/lab/campaigns/4/snippets');
    expect(paths.labSnippets.getHref(4, { target: 'DPD 0417+3021' })).toBe(
      '/lab/campaigns/4/snippets?target=DPD%200417%2B3021',
    );
    expect(apiPaths.campaignLightCurves(4)).toBe('/api/campaigns/4/light-curves');
  });
});

describe('Mail paths', () => {
  it('carries a token from a mail link encoded, and the outbox page only past the first', () => {
    expect(paths.passwordResetConfirm.getHref('a+b/c')).toBe('/password-reset/confirm?token=a%2Bb%2Fc');
    expect(paths.confirmEmail.getHref('t0k3n')).toBe('/confirm-email?token=t0k3n');
    expect(paths.adminOutbox.getHref()).toBe('/admin/outbox');
    expect(paths.adminOutbox.getHref(3)).toBe('/admin/outbox?page=3');
    expect(paths.adminOutboxMessage.getHref(12)).toBe('/admin/outbox/12');
    expect(apiPaths.outboxMessage(12)).toBe('/api/admin/outbox/12');
    expect(apiPaths.confirmEmailResend()).toBe('/api/auth/confirm-email/resend');
  });
});
