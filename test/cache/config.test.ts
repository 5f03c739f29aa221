/**
 * CACHE_MAX_BYTES: default 128 MiB, 0 switches the cache off, bad values refused with a message
 * naming the variable; documented in README.md and .env.example.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { ConfigError, loadConfig } from '../../src/config.js';

describe('CACHE_MAX_BYTES', () => {
  it('defaults to 128 MiB and reads 0 and other whole numbers', () => {
    expect(loadConfig({}).CACHE_MAX_BYTES).toBe(134_217_728);
    expect(loadConfig({ CACHE_MAX_BYTES: '0' }).CACHE_MAX_BYTES).toBe(0);
    expect(loadConfig({ CACHE_MAX_BYTES: '1048576' }).CACHE_MAX_BYTES).toBe(1_048_576);
  });

  it('refuses negative, fractional, non-numeric and oversized values, naming the variable', () => {
    for (const [value, message] of [
      ['-1', /CACHE_MAX_BYTES: CACHE_MAX_BYTES must not be negative/],
      ['1.5', /CACHE_MAX_BYTES must be a whole number of bytes/],
      ['lots', /CACHE_MAX_BYTES must be a number of bytes.*\(got "lots"\)/],
      [String(2 ** 40), /CACHE_MAX_BYTES must not exceed 17179869184/],
    ] as const) {
      expect(() => loadConfig({ CACHE_MAX_BYTES: value })).toThrow(ConfigError);
      expect(() => loadConfig({ CACHE_MAX_BYTES: value })).toThrow(message);
    }
  });

  it('is documented in README.md and .env.example', () => {
    const readme = readFileSync(new URL('../../README.md', import.meta.url), 'utf8');
    const example = readFileSync(new URL('../../.env.example', import.meta.url), 'utf8');
    expect(readme).toMatch(/\| `CACHE_MAX_BYTES` \| 134217728 \|/);
    expect(example).toContain('CACHE_MAX_BYTES=134217728');
  });
});
