import { describe, expect, it } from 'vitest';
import { appUrlHostWarning } from '../../server/env';

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
