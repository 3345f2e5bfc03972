import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { ConfigError, loadConfig } from '../../../server/config';

describe('loadConfig', () => {
  it('gives safe defaults: port 3000, ./data, SQLite, embedded Redis and mail, demo on', () => {
    const config = loadConfig({});
    expect(config.port).toBe(3000);
    expect(config.dataDir).toBe(path.resolve('./data'));
    expect(config.sqliteFile).toBe(path.resolve('./data/dipdeck.sqlite'));
    expect(config.databaseUrl).toBeUndefined();
    expect(config.redisUrl).toBeUndefined();
    expect(config.smtpUrl).toBeUndefined();
    expect(config.demo).toBe(true);
    expect(config.publicUrl).toBe('http://localhost:3000');
  });

  it('reads DIPDECK_DEMO=0 as no demo data, and empty values as unset', () => {
    expect(loadConfig({ DIPDECK_DEMO: '0' }).demo).toBe(false);
    expect(loadConfig({ REDIS_URL: '' }).redisUrl).toBeUndefined();
  });

  it('names every bad variable', () => {
    const attempt = () => loadConfig({ PORT: 'eighty', DATABASE_URL: 'mysql://x', SESSION_SECRET: 'short' });
    expect(attempt).toThrow(ConfigError);
    expect(attempt).toThrow(/PORT/);
    expect(attempt).toThrow(/DATABASE_URL/);
    expect(attempt).toThrow(/SESSION_SECRET/);
  });
});
