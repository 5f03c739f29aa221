import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { ConfigError, loadConfig } from '../src/config.js';
import { VERSION } from '../src/version.js';

describe('configuration', () => {
  it('has documented defaults: port 8080, info logs, 64 KiB bodies', () => {
    const c = loadConfig({});
    expect(c.PORT).toBe(8080);
    expect(c.HOST).toBe('0.0.0.0');
    expect(c.LOG_LEVEL).toBe('info');
    expect(c.BODY_LIMIT_BYTES).toBe(65_536);
  });

  it('reads and coerces the environment', () => {
    const c = loadConfig({ PORT: '9000', LOG_LEVEL: 'warn', BODY_LIMIT_BYTES: '1024' });
    expect(c).toMatchObject({ PORT: 9000, LOG_LEVEL: 'warn', BODY_LIMIT_BYTES: 1024 });
  });

  it('names each bad variable', () => {
    expect(() => loadConfig({ PORT: 'eighty' })).toThrow(ConfigError);
    expect(() => loadConfig({ PORT: '70000' })).toThrow(/PORT/);
    // Each message says what is wrong in words and quotes the value given.
    expect(() => loadConfig({ PORT: 'eighty' })).toThrow('PORT: must be a number (got "eighty")');
    expect(() => loadConfig({ PORT: '70000' })).toThrow('PORT: must be a port number from 0 to 65535 (got "70000")');
    expect(() => loadConfig({ BODY_LIMIT_BYTES: '0' })).toThrow('BODY_LIMIT_BYTES: must be positive (got "0")');
    expect(() => loadConfig({ SWEEP_MAX_POINTS: '2.5' })).toThrow('SWEEP_MAX_POINTS: must be a whole number (got "2.5")');
    expect(() => loadConfig({ LOG_LEVEL: 'loud' })).toThrow(/LOG_LEVEL/);
  });

  it('operations defaults: metrics on, CORS and rate limit off, shedding thresholds for a 2-core 24 GiB machine', () => {
    const c = loadConfig({});
    expect(c).toMatchObject({ METRICS_ENABLED: true, CORS_ORIGINS: [], RATE_LIMIT_MAX: 0, RATE_LIMIT_WINDOW_MS: 60_000, RETRY_AFTER_S: 5 });
    expect(c.MAX_EVENT_LOOP_DELAY_MS).toBe(1000);
    expect(c.MAX_HEAP_USED_BYTES).toBe(3 * 1024 ** 3);
    expect(c.MAX_RSS_BYTES).toBe(6 * 1024 ** 3);
  });

  it('reads CORS_ORIGINS as a list of origins, "*" only alone, empty as off', () => {
    expect(loadConfig({ CORS_ORIGINS: 'https://calc.example.org, http://localhost:5173/' }).CORS_ORIGINS).toEqual(['https://calc.example.org', 'http://localhost:5173']);
    expect(loadConfig({ CORS_ORIGINS: '*' }).CORS_ORIGINS).toEqual(['*']);
    expect(loadConfig({ CORS_ORIGINS: '' }).CORS_ORIGINS).toEqual([]);
    for (const bad of ['calc.example.org', 'https://calc.example.org/page', 'ftp://files.example.org', '*,https://a.example.org', 'https://']) {
      expect(() => loadConfig({ CORS_ORIGINS: bad }), bad).toThrow(/CORS_ORIGINS/);
    }
  });

  it('reads METRICS_ENABLED as a flag ("false" is false)', () => {
    expect(loadConfig({ METRICS_ENABLED: 'false' }).METRICS_ENABLED).toBe(false);
    expect(loadConfig({ METRICS_ENABLED: '0' }).METRICS_ENABLED).toBe(false);
    expect(loadConfig({ METRICS_ENABLED: 'TRUE' }).METRICS_ENABLED).toBe(true);
    expect(() => loadConfig({ METRICS_ENABLED: 'maybe' })).toThrow(/METRICS_ENABLED/);
  });

  it('names each bad operations variable', () => {
    const bad: Record<string, string> = {
      RATE_LIMIT_MAX: '-1',
      RATE_LIMIT_WINDOW_MS: '0',
      MAX_EVENT_LOOP_DELAY_MS: 'soon',
      MAX_HEAP_USED_BYTES: '1.5',
      MAX_RSS_BYTES: '-4',
      RETRY_AFTER_S: '0',
      TRUST_PROXY_HOPS: '11',
    };
    for (const [key, value] of Object.entries(bad)) {
      expect(() => loadConfig({ [key]: value }), key).toThrow(ConfigError);
      expect(() => loadConfig({ [key]: value }), key).toThrow(new RegExp(`^invalid configuration:\\n  ${key}: `));
    }
    expect(loadConfig({ RATE_LIMIT_MAX: '100', RATE_LIMIT_WINDOW_MS: '1000', MAX_EVENT_LOOP_DELAY_MS: '0' })).toMatchObject({
      RATE_LIMIT_MAX: 100,
      RATE_LIMIT_WINDOW_MS: 1000,
      MAX_EVENT_LOOP_DELAY_MS: 0,
    });
  });

  it('every variable is documented in README.md and .env.example', () => {
    const readme = readFileSync(new URL('../README.md', import.meta.url), 'utf8');
    const example = readFileSync(new URL('../.env.example', import.meta.url), 'utf8');
    for (const key of Object.keys(loadConfig({}))) {
      expect(readme).toContain(`\`${key}\``);
      expect(example).toContain(`${key}=`);
    }
  });

  it('the service version is the package version', () => {
    const pkg = JSON.parse(readFileSync(new URL('../package.json', import.meta.url), 'utf8')) as { version: string };
    expect(VERSION).toBe(pkg.version);
  });
});
