import { describe, expect, it } from 'vitest';
import { ConfigError, loadConfig } from '#server/config';

/** The configuration with only TRUST_PROXY varied (a secret given, so nothing is written). */
const withTrustProxy = (value: string | undefined) =>
  loadConfig({
    DATABASE_URL: 'postgres://hilum@127.0.0.1:5432/hilum',
    SESSION_SECRET: 's'.repeat(32),
    ...(value === undefined ? {} : { TRUST_PROXY: value }),
  }).trustProxy;

describe('TRUST_PROXY', () => {
  it('when it is unset, empty, false or 0, then no proxy is trusted', () => {
    for (const value of [undefined, '', ' ', 'false', 'FALSE', '0'])
      expect(withTrustProxy(value)).toBe(false);
  });

  it('when it names proxies, then they are the list Express is given', () => {
    expect(withTrustProxy('loopback')).toEqual(['loopback']);
    expect(withTrustProxy(' 10.0.0.5, 10.1.0.0/16 ,uniquelocal, fd00::/8,::1')).toEqual([
      '10.0.0.5',
      '10.1.0.0/16',
      'uniquelocal',
      'fd00::/8',
      '::1',
    ]);
  });

  it('when it is a number, then that many hops in front of the app are trusted', () => {
    expect(withTrustProxy('2')).toBe(2);
  });

  it('when it is true, a name Express does not know or a bad subnet, then the server refuses to start, saying why', () => {
    for (const value of [
      'true',
      '*',
      'all',
      'proxy.example.org',
      '10.0.0.0/33',
      '10.0.0.1/8/8',
      '-1',
      '10.0.0',
    ]) {
      expect(() => withTrustProxy(value), value).toThrow(ConfigError);
    }
    expect(() => withTrustProxy('true')).toThrow(/TRUST_PROXY: "true" is not a proxy address/);
  });
});
