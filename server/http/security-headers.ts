import type { RequestHandler } from 'express';
import helmet from 'helmet';
import type { Config } from '../config';

/**
 * The Content-Security-Policy of every answer. Only our own files run: no inline or evaluated script
 * anywhere, no inline `<style>` elements, nothing from another origin. Style attributes stay allowed
 * for one reason: a mail shown in its sandboxed frame (src/lib/sandboxed-mail.ts) is styled inline,
 * as mail must be, and a srcdoc frame inherits this policy. They cannot run code or, with img-src and
 * font-src as they are, fetch anything.
 */
export const contentSecurityPolicy = (config: Pick<Config, 'isProduction'>) => ({
  'default-src': ["'self'"],
  'base-uri': ["'self'"],
  'connect-src': ["'self'"],
  'font-src': ["'self'"],
  'form-action': ["'self'"],
  'frame-ancestors': ["'none'"],
  'frame-src': ["'self'"],
  'img-src': ["'self'", 'data:'],
  'manifest-src': ["'self'"],
  'media-src': ["'none'"],
  'object-src': ["'none'"],
  'script-src': ["'self'"],
  'script-src-attr': ["'none'"],
  'style-src': ["'self'"],
  'style-src-elem': ["'self'"],
  'style-src-attr': ["'unsafe-inline'"],
  'worker-src': ["'self'"],
  'upgrade-insecure-requests': config.isProduction ? [] : null,
});

/** helmet's headers with our policy; HSTS only in production, where Dipdeck is served over HTTPS. */
export function securityHeaders(config: Pick<Config, 'isProduction'>): RequestHandler {
  return helmet({
    contentSecurityPolicy: { useDefaults: false, directives: contentSecurityPolicy(config) },
    strictTransportSecurity: config.isProduction
      ? { maxAge: 365 * 24 * 3600, includeSubDomains: true }
      : false,
    xFrameOptions: { action: 'deny' },
  });
}
