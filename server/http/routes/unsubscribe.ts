import type { Request, Response } from 'express';
import { z } from 'zod';
import { resolveSessionSecret } from '../../auth/session-secret';
import { AppError } from '../../errors';
import { escapeHtml } from '../../mail/layout';
import { unsubscribe, unsubscribeTarget } from '../../services/mail/unsubscribe';
import type { AppDeps } from '../app-deps';
import { defineRoute } from '../define-route';

const tokenQuery = z.object({ token: z.string('The link has no token').max(200) });

/** A small page of our own: the link is opened from a mail client, often not signed in, often on a phone. */
function page(res: Response, status: number, title: string, body: string): void {
  res
    .status(status)
    .type('html')
    .send(
      `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><title>${escapeHtml(title)} · Dipdeck</title></head>` +
        `<body style="font-family: system-ui, sans-serif; max-width: 34rem; margin: 3rem auto; padding: 0 1rem; line-height: 1.5; color: #1d2433">` +
        `<p style="font-weight: 600">Dipdeck</p><h1 style="font-size: 1.5rem">${escapeHtml(title)}</h1>${body}</body></html>`,
    );
}

const wantsJson = (req: Request) => req.accepts(['html', 'json']) === 'json';

export const unsubscribeRoutes = (deps: AppDeps) => {
  const secret = resolveSessionSecret(deps.config.sessionSecret, deps.config.dataDir);
  const record = `${deps.config.publicUrl}/record`;
  const badLink = (res: Response, error: AppError) =>
    page(
      res,
      400,
      'This link does not work',
      `<p>${escapeHtml(error.message)}. Copy the whole link from the e-mail, or change your e-mail preferences on <a href="${record}">My record</a>.</p>`,
    );

  return [
    defineRoute({
      method: 'get',
      path: '/unsubscribe',
      access: 'public',
      summary: 'The unsubscribe page a newsletter links to: one button, no sign-in (HTML)',
      query: tokenQuery,
      handle: async ({ res, query }) => {
        try {
          const { subscribed } = await unsubscribeTarget(deps.db, secret, query.token);
          if (!subscribed) {
            page(
              res,
              200,
              'You do not get the newsletter',
              `<p>Nothing more to do. You can opt in again on <a href="${record}">My record</a>.</p>`,
            );
            return;
          }
          page(
            res,
            200,
            'Stop the Dipdeck newsletter?',
            `<p>One click and no more newsletters come to this address. Mail about your account (password resets, for example) still does.</p>` +
              `<form method="post" action="?token=${encodeURIComponent(query.token)}"><button type="submit" style="font: inherit; padding: 0.75rem 1.25rem; min-height: 44px; border-radius: 6px; border: 1px solid #1d2433; background: #1d2433; color: #fff">Unsubscribe</button></form>`,
          );
        } catch (error) {
          if (error instanceof AppError) badLink(res, error);
          else throw error;
        }
      },
    }),
    defineRoute({
      method: 'post',
      path: '/unsubscribe',
      access: 'public',
      summary:
        'One-click unsubscribe (RFC 8058: List-Unsubscribe-Post); takes effect at once, no sign-in, no CSRF token',
      query: tokenQuery,
      // Mail clients post here with nothing but the link: a session's CSRF token cannot exist.
      csrf: false,
      handle: async ({ req, res, query }) => {
        try {
          const answer = await unsubscribe(deps.db, secret, query.token);
          if (wantsJson(req)) return answer;
          page(
            res,
            200,
            'You are unsubscribed',
            `<p>No more newsletters will come to this address. Changed your mind? Opt in again on <a href="${record}">My record</a>.</p>`,
          );
        } catch (error) {
          if (error instanceof AppError && !wantsJson(req)) badLink(res, error);
          else throw error;
        }
      },
    }),
  ];
};
