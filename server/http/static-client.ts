import fs from 'node:fs';
import path from 'node:path';
import express, { type RequestHandler } from 'express';

export const CLIENT_DIR = path.resolve(import.meta.dirname, '../../dist/client');

/** Serves the built client, with index.html for every non-API path so that client routes deep-link. */
export function staticClient(): RequestHandler[] {
  const indexFile = path.join(CLIENT_DIR, 'index.html');
  const assets = express.static(CLIENT_DIR, {
    index: false,
    setHeaders(res, file) {
      // Vite puts a content hash in asset names, so they never change.
      if (file.includes(`${path.sep}assets${path.sep}`))
        res.setHeader('Cache-Control', 'public, max-age=31536000, immutable');
    },
  });
  const fallback: RequestHandler = (req, res, next) => {
    if (req.method !== 'GET' && req.method !== 'HEAD') return next();
    if (!fs.existsSync(indexFile)) {
      res.status(503).type('text/plain').send('The client is not built yet: run `npm run build`.');
      return;
    }
    res.setHeader('Cache-Control', 'no-cache');
    res.sendFile(indexFile);
  };
  return [assets, fallback];
}
