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
    expect(() => loadConfig({ LOG_LEVEL: 'loud' })).toThrow(/LOG_LEVEL/);
  });

  it('every variable is documented in README.md and .env.example', () => {
    const readme = readFileSync(new URL('../README.md', import.meta.url), 'utf8');
    const example = readFileSync(new URL('../.env.example', import.meta.url), 'utf8');
    for (const key of ['PORT', 'HOST', 'LOG_LEVEL', 'BODY_LIMIT_BYTES', 'REQUEST_TIMEOUT_MS', 'SHUTDOWN_GRACE_MS', 'SWEEP_MAX_POINTS', 'CACHE_MAX_BYTES']) {
      expect(readme).toContain(`\`${key}\``);
      expect(example).toContain(`${key}=`);
    }
  });

  it('the service version is the package version', () => {
    const pkg = JSON.parse(readFileSync(new URL('../package.json', import.meta.url), 'utf8')) as { version: string };
    expect(VERSION).toBe(pkg.version);
  });
});
