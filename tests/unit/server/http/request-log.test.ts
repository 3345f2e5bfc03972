import { Writable } from 'node:stream';
import express from 'express';
import pino from 'pino';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { requestLog } from '../../../../server/http/request-log';

function appLogging(level: string) {
  const lines: Record<string, unknown>[] = [];
  const sink = new Writable({
    write(chunk, _encoding, done) {
      lines.push(JSON.parse(String(chunk)));
      done();
    },
  });
  const app = express();
  app.use(requestLog(pino({ level }, sink)));
  app.get('/api/thing', (req, res) => {
    req.user = { id: 7 } as Express.User;
    res.status(201).json({ id: req.id });
  });
  app.get('/index.html', (_req, res) => res.send('page'));
  return { app, lines };
}

describe('request log', () => {
  it('writes one line per API request with its status, time and person', async () => {
    const { app, lines } = appLogging('info');
    const first = await request(app).get('/api/thing?x=1');
    const second = await request(app).get('/api/thing');
    expect(second.body.id).toBe(first.body.id + 1);
    await new Promise((resolve) => setImmediate(resolve));
    expect(lines).toHaveLength(2);
    expect(lines[0]).toMatchObject({
      msg: 'request completed',
      req: { id: first.body.id, method: 'GET', url: '/api/thing?x=1' },
      res: { status: 201 },
      personId: 7,
    });
    expect(typeof lines[0]!.responseTime).toBe('number');
  });

  it('leaves pages out, and writes nothing below its level', async () => {
    const quiet = appLogging('warn');
    await request(quiet.app).get('/api/thing');
    const pages = appLogging('info');
    await request(pages.app).get('/index.html');
    await new Promise((resolve) => setImmediate(resolve));
    expect(quiet.lines).toEqual([]);
    expect(pages.lines).toEqual([]);
  });
});
