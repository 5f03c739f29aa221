/**
 * The canonical cache key: sha256 (hex) of a stable serialisation of { service version, route path,
 * canonical input }. Routes supply the canonical input (ComputeRoute.canonical: normalised, defaults
 * applied, exact doubles) so that key order, equivalent unit spellings and omitted defaults give the
 * same key; GET and POST build the same input and so share entries.
 */
import * as crypto from 'node:crypto';

/** Nesting deeper than this is refused (and so are cycles, which nest without end). */
const MAX_DEPTH = 64;

/**
 * A deterministic text for a JSON-like value: object keys sorted (recursively), keys whose value is
 * undefined left out (as if omitted), numbers in their shortest round-trip form with -0, NaN and
 * ±Infinity spelled apart (so distinct doubles never share a text), strings JSON-quoted.
 * Throws a TypeError on values with no such text (functions, symbols, bigints, cycles, nesting
 * deeper than 64). Plain loops and concatenation: it runs on every request, hits included.
 */
export function stableStringify(value: unknown): string {
  return write(value, 0);
}

/** Record keys as JSON strings, remembered: keys come from the schemas' small set of field names. */
const QUOTED_KEYS = new Map<string, string>();
const MAX_QUOTED_KEYS = 4096;

function quotedKey(k: string): string {
  let quoted = QUOTED_KEYS.get(k);
  if (quoted === undefined) {
    quoted = JSON.stringify(k);
    // Bounded: a strict schema admits only its own field names, but a route without canonical()
    // keys its validated input as is, so the table must not grow with what clients send.
    if (QUOTED_KEYS.size < MAX_QUOTED_KEYS && k.length <= 64) QUOTED_KEYS.set(k, quoted);
  }
  return quoted;
}

function write(v: unknown, depth: number): string {
  switch (typeof v) {
    case 'number':
      return v === 0 && 1 / v < 0 ? '-0' : String(v); // String gives NaN, Infinity, -Infinity unquoted
    case 'string':
      return JSON.stringify(v);
    case 'boolean':
      return v ? 'true' : 'false';
    case 'undefined':
      return 'undefined';
    case 'object': {
      if (v === null) return 'null';
      if (depth >= MAX_DEPTH) throw new TypeError('stableStringify: nesting too deep (or cyclic)');
      if (Array.isArray(v)) {
        let out = '[';
        for (let i = 0; i < v.length; i++) out += (i === 0 ? '' : ',') + write(v[i], depth + 1);
        return out + ']';
      }
      const record = v as Record<string, unknown>;
      const keys = Object.keys(record).sort();
      let out = '{';
      let first = true;
      for (const k of keys) {
        const x = record[k];
        if (x === undefined) continue;
        out += (first ? '' : ',') + quotedKey(k) + ':' + write(x, depth + 1);
        first = false;
      }
      return out + '}';
    }
    default:
      throw new TypeError(`stableStringify: cannot serialise a ${typeof v}`);
  }
}

/** The cache key (64 hex digits) of a request: version, route path and canonical input. */
export function cacheKey(version: string, route: string, input: unknown): string {
  return sha256Hex(stableStringify({ version, route, input }));
}

/** sha256 in hex: the one-shot crypto.hash where Node has it (20.12+, about twice as fast), else createHash. */
const sha256Hex: (text: string) => string =
  typeof crypto.hash === 'function'
    ? (text) => crypto.hash('sha256', text, 'hex')
    : (text) => crypto.createHash('sha256').update(text).digest('hex');

/**
 * The canonical form of a normalised body: what the response depends on. Mass, rg, tg, J, Q in
 * coulombs and the family all follow from gm, spin, charge and radius; the preset adds its name and
 * rotation rate to the echo.
 */
export function canonicalBody(body: {
  preset: string | null;
  gm: number;
  spin: number;
  charge: number;
  radius: number | null;
  radiusGeometric: number | null;
}): { preset: string | null; gm: number; spin: number; charge: number; radius: number | null; radiusGeometric: number | null } {
  // radiusGeometric is kept as read ("3 rg" is exactly 3; 3·rg in metres divided back may not be).
  return {
    preset: body.preset,
    gm: body.gm,
    spin: body.spin,
    charge: body.charge,
    radius: body.radius,
    radiusGeometric: body.radiusGeometric,
  };
}

/** The canonical form of a normalised point: r in m and in GM/c² (both exact), altitude and θ. */
export function canonicalPoint(point: { r: number; rGeometric: number; altitude: number | null; theta: number }): {
  r: number;
  rGeometric: number;
  altitude: number | null;
  theta: number;
} {
  return { r: point.r, rGeometric: point.rGeometric, altitude: point.altitude, theta: point.theta };
}
