/**
 * If-None-Match matching (RFC 9110 §13.1.2: "*", lists, weak comparison) and the ETag form.
 */
import { describe, expect, it } from 'vitest';
import { etagFor, ifNoneMatchMatches } from '../../src/cache/http.js';

const tag = etagFor('ab12');

describe('ifNoneMatchMatches', () => {
  it('the ETag is the quoted key', () => {
    expect(tag).toBe('"ab12"');
  });

  it('matches the exact tag, "*", a tag in a list, and a weak form of the tag', () => {
    expect(ifNoneMatchMatches('"ab12"', tag)).toBe(true);
    expect(ifNoneMatchMatches('*', tag)).toBe(true);
    expect(ifNoneMatchMatches('"zz", "ab12" ,"yy"', tag)).toBe(true);
    expect(ifNoneMatchMatches('W/"ab12"', tag)).toBe(true);
    expect(ifNoneMatchMatches(['"zz"', '"ab12"'], tag)).toBe(true);
  });

  it('does not match another tag, an unquoted key, a prefix, or no header', () => {
    expect(ifNoneMatchMatches('"ab1"', tag)).toBe(false);
    expect(ifNoneMatchMatches('ab12', tag)).toBe(false);
    expect(ifNoneMatchMatches('"ab12x"', tag)).toBe(false);
    expect(ifNoneMatchMatches('', tag)).toBe(false);
    expect(ifNoneMatchMatches(undefined, tag)).toBe(false);
  });
});
