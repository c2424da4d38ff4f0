import { describe, expect, it } from 'vitest';
import { loadConfig } from '../../../server/config';

describe('loadConfig', () => {
  it('serves on 127.0.0.1:3000 with the app database by default', () => {
    const c = loadConfig({ SESSION_SECRET: 's' });
    expect(c.host).toBe('127.0.0.1');
    expect(c.port).toBe(3000);
    expect(c.db.port).toBe(33306);
    expect(c.db.database).toBe('fanlight');
  });

  it('uses its own database port and name under NODE_ENV=test, so tests run beside the app', () => {
    const c = loadConfig({ NODE_ENV: 'test', SESSION_SECRET: 's' });
    expect(c.db.port).toBe(33307);
    expect(c.db.database).toBe('fanlight_test');
  });

  it('lets PORT override the port', () => {
    expect(loadConfig({ PORT: '4100', SESSION_SECRET: 's' }).port).toBe(4100);
  });

  it('refuses a port that is not a number, naming the variable', () => {
    expect(() => loadConfig({ PORT: 'abc', SESSION_SECRET: 's' })).toThrow(/PORT must be a port number/);
  });

  it('requires a session secret in production', () => {
    expect(() => loadConfig({ NODE_ENV: 'production' })).toThrow(/SESSION_SECRET/);
  });
});
