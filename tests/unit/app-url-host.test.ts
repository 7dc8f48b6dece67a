import { describe, expect, it } from 'vitest';
import { appUrlHostWarning, defaultAppUrl, loadConfig } from '../../server/env';

/** Just enough environment for the loader in a test (no database is opened). */
const baseEnv = { NODE_ENV: 'test', LOG_LEVEL: 'silent', SESSION_SECRET: 'test-session-secret-0123456789' };

describe('the startup check of APP_URL against the listening host', () => {
  it('when the links say localhost and the app listens on 127.0.0.1, then it warns and names both', () => {
    const warning = appUrlHostWarning('http://localhost:3000', '127.0.0.1');
    expect(warning).toMatch(/localhost/);
    expect(warning).toMatch(/127\.0\.0\.1/);
  });

  it('when the links say 127.0.0.1 and the app listens on localhost, then it warns', () => {
    expect(appUrlHostWarning('http://127.0.0.1:3000', 'localhost')).toBeDefined();
  });

  it('when both name the same host, then it says nothing', () => {
    expect(appUrlHostWarning('http://127.0.0.1:3000', '127.0.0.1')).toBeUndefined();
    expect(appUrlHostWarning('http://LOCALHOST:3000/', 'localhost')).toBeUndefined();
    expect(appUrlHostWarning('http://[::1]:3000', '::1')).toBeUndefined();
  });

  it('when the app listens on every address, or the links use a public name (a proxy in front), then it says nothing', () => {
    expect(appUrlHostWarning('http://localhost:3000', '0.0.0.0')).toBeUndefined();
    expect(appUrlHostWarning('https://tenthmark.example', '127.0.0.1')).toBeUndefined();
  });
});

describe('APP_URL when it is not set', () => {
  it('names the host and port the app listens on, so its links open where the person browses', () => {
    expect(defaultAppUrl('127.0.0.1', 3000)).toBe('http://127.0.0.1:3000');
    expect(defaultAppUrl('localhost', 4100)).toBe('http://localhost:4100');
    expect(defaultAppUrl('machine.lan', 3000)).toBe('http://machine.lan:3000');
  });

  it('writes an IPv6 host in brackets, and says localhost when the app listens on every address', () => {
    expect(defaultAppUrl('::1', 3000)).toBe('http://[::1]:3000');
    expect(defaultAppUrl('[::1]', 3000)).toBe('http://[::1]:3000');
    expect(defaultAppUrl('0.0.0.0', 3000)).toBe('http://localhost:3000');
    expect(defaultAppUrl('::', 3000)).toBe('http://localhost:3000');
  });

  it('is what the configuration uses, and then the startup check has nothing to warn about', () => {
    for (const HOST of ['127.0.0.1', 'localhost', '::1']) {
      const config = loadConfig({ ...baseEnv, HOST, PORT: '3456' });
      expect(config.appUrl).toBe(defaultAppUrl(HOST, 3456));
      expect(appUrlHostWarning(config.appUrl, config.host)).toBeUndefined();
    }
    expect(loadConfig({ ...baseEnv, HOST: '127.0.0.1', APP_URL: 'https://tenthmark.example/' }).appUrl).toBe('https://tenthmark.example');
  });
});
