import { describe, expect, it } from 'vitest';
import { loadConfig, redisConnection } from './configuration.js';

const base = {
  DATABASE_URL: 'postgres://u:p@127.0.0.1:5433/quietglass',
  REDIS_URL: 'redis://127.0.0.1:6380',
  JWT_SECRET: 'x'.repeat(40),
};

describe('loadConfig', () => {
  it('applies safe defaults: loopback host, port 3000, 10 sign-in attempts a minute', () => {
    const c = loadConfig(base);
    expect(c).toMatchObject({
      host: '127.0.0.1',
      port: 3000,
      signInLimit: 10,
      signInWindowMs: 60_000,
      cookieSecure: false,
      trustProxy: false,
      sessionIdleSeconds: 30 * 60,
    });
  });

  it('reads COOKIE_SECURE as the usual true/false words and refuses anything else', () => {
    for (const word of ['true', '1', 'yes', 'YES', 'on'])
      expect(loadConfig({ ...base, COOKIE_SECURE: word }).cookieSecure).toBe(true);
    for (const word of ['false', '0', 'no', 'off'])
      expect(loadConfig({ ...base, COOKIE_SECURE: word }).cookieSecure).toBe(false);
    expect(() => loadConfig({ ...base, COOKIE_SECURE: 'sure' })).toThrow(
      'COOKIE_SECURE must be true or false (also 1/0, yes/no, on/off), got "sure"',
    );
  });

  it('trusts forwarded addresses only from the proxy TRUST_PROXY names', () => {
    expect(loadConfig({ ...base, TRUST_PROXY: '10.1.2.3' }).trustProxy).toBe('10.1.2.3');
  });

  it('names the variable that is missing or wrong', () => {
    expect(() => loadConfig({ ...base, DATABASE_URL: '' })).toThrow('DATABASE_URL is not set');
    expect(() => loadConfig({ ...base, JWT_SECRET: 'short' })).toThrow(
      'JWT_SECRET must be at least 32 characters',
    );
    expect(() => loadConfig({ ...base, PORT: '-1' })).toThrow(
      'PORT must be a positive whole number, got "-1"',
    );
    expect(() => loadConfig({ ...base, PORT: 'abc' })).toThrow(/PORT/);
  });
});

describe('redisConnection', () => {
  it('parses host, port, password and database number', () => {
    expect(redisConnection('redis://:s%40cret@10.0.0.5:6390/2')).toMatchObject({
      host: '10.0.0.5',
      port: 6390,
      password: 's@cret',
      db: 2,
      maxRetriesPerRequest: null,
    });
    expect(redisConnection('redis://127.0.0.1')).toMatchObject({ port: 6379, db: 0 });
  });

  it('rejects other schemes', () => {
    expect(() => redisConnection('http://127.0.0.1:6379')).toThrow('REDIS_URL must start with redis://');
  });
});
