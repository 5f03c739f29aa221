/**
 * Proper-time intervals: free fall against test/fixtures/python/proper_time.py (mpmath Gauss–Legendre
 * and tanh-sinh at 80 digits, textbook integrands), the Schwarzschild closed forms against the
 * quadrature, published values, refusals, stationary clocks and circular orbits.
 */
import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { stationaryObserver, type Observer } from '../../src/physics/observers.js';
import { freeFall } from '../../src/physics/free-fall.js';
import { riverFrameProperTime, schwarzschildDropFromRest } from '../../src/physics/free-fall-schwarzschild.js';
import type { FallStart, FreeFall, FreeFallResult } from '../../src/physics/free-fall-types.js';
import { circularOrbitRevolutions, stationaryFarAwayTime, stationaryProperTime } from '../../src/physics/proper-time.js';

interface FallCase {
  a: number;
  q: number;
  theta: number;
  r1: number;
  r2: number;
  start: FallStart['kind'];
  speed: number;
  direction: 'inward' | 'outward';
  geometry: string;
  energy: number;
  ok: boolean;
  reason?: string;
  turningRadius?: number;
  properTime?: number;
  riverTime?: number | null;
  farAwayTime?: number | null;
}

const fixture = JSON.parse(readFileSync(new URL('../fixtures/proper_time.json', import.meta.url), 'utf8')) as {
  dps: number;
  freeFall: FallCase[];
};

function startOf(c: FallCase): FallStart {
  if (c.start === 'launch') return { kind: 'launch', speed: c.speed, direction: c.direction };
  return { kind: c.start };
}

function ok(r: FreeFallResult): FreeFall {
  if (!r.ok) throw new Error(`refused: ${r.reason}`);
  return r;
}

const rel = (x: number, y: number) => Math.abs(x - y) / Math.max(Math.abs(y), 1e-300);

describe('free fall against the mpmath fixture', () => {
  it('has a real set of paths to test', () => {
    expect(fixture.dps).toBeGreaterThanOrEqual(30);
    expect(fixture.freeFall.filter((c) => c.ok).length).toBeGreaterThan(40);
    expect(fixture.freeFall.filter((c) => !c.ok).length).toBeGreaterThan(5);
    for (const g of ['radial', 'axis', 'equator']) expect(fixture.freeFall.some((c) => c.geometry === g)).toBe(true);
  });

  for (const c of fixture.freeFall) {
    const name = `${c.geometry} a=${c.a} q=${c.q} ${c.start}${c.start === 'launch' ? ` v=${c.speed} ${c.direction}` : ''} ${c.r1} → ${c.r2}`;
    it(name, () => {
      const s = { a: c.a, q: c.q };
      const req = { r1: c.r1, r2: c.r2, theta: c.theta, start: startOf(c) };
      for (const method of ['auto', 'quadrature'] as const) {
        const r = freeFall(s, req, { method });
        if (!c.ok) {
          expect(r.ok).toBe(false);
          if (r.ok) return;
          expect(r.reason).toBe(c.reason);
          // 1e-10: bisection to the last bit of the potential, which near a simple root is accurate
          // to a few ulp of its terms.
          if (c.turningRadius !== undefined) expect(rel(r.turningRadius!, c.turningRadius)).toBeLessThan(1e-10);
          continue;
        }
        const f = ok(r);
        expect(f.geometry).toBe(c.geometry);
        // 1e-13: E is one square root of the lapse (closed form).
        expect(rel(f.energy, c.energy)).toBeLessThanOrEqual(1e-13);
        // 1e-12 for quadrature: the requested relative tolerance of the tanh-sinh rule, whose stopping
        // test |S_k − S_{k−1}| ≤ 1e-12 |S_k| over-estimates the error (observed ≤ 2e-15 on this set,
        // including ends at turning points, r = 0 and 1e-6 from the horizon). 1e-12 also for the
        // Schwarzschild closed forms (a few roundings; the logarithms near the horizon are formed
        // from r₂ − 2 directly).
        const tol = 1e-12;
        expect(rel(f.properTime, c.properTime!), 'properTime').toBeLessThanOrEqual(tol);
        for (const k of ['riverTime', 'farAwayTime'] as const) {
          const want = c[k] ?? null;
          if (want === null) {
            expect(f[k], k).toBeNull();
            expect(f[`${k}Reason`]).toBeDefined();
          } else {
            expect(f[k], k).not.toBeNull();
            expect(rel(f[k]!, want), k).toBeLessThanOrEqual(tol);
          }
        }
        if (f.method === 'quadrature') {
          expect(f.errorEstimate.properTime).toBeLessThanOrEqual(1e-12 * f.properTime);
          expect(f.evaluations).toBeGreaterThan(0);
        }
      }
    });
  }
});

describe('Schwarzschild closed forms against the quadrature', () => {
  const S = { a: 0, q: 0 };
  it('river frame (from rest at infinity): τ = T = (2/3)(r₁^{3/2} − r₂^{3/2})/√2, and t', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.1, max: 1e4, noNaN: true }), fc.double({ min: 0, max: 0.999, noNaN: true }), (r1, k) => {
        const r2 = r1 * k;
        const req = { r1, r2, theta: 1, start: { kind: 'restAtInfinity' as const } };
        const closed = ok(freeFall(S, req));
        const quad = ok(freeFall(S, req, { method: 'quadrature' }));
        expect(closed.method).toBe('closedForm');
        expect(quad.method).toBe('quadrature');
        // 1e-11: the quadrature at tolerance 1e-12 against a closed form with a few roundings.
        expect(rel(closed.properTime, quad.properTime)).toBeLessThan(1e-11);
        expect(closed.riverTime).toBe(closed.properTime);
        expect(rel(quad.riverTime!, quad.properTime)).toBeLessThan(1e-11);
        if (r2 > 2.001) expect(rel(closed.farAwayTime!, quad.farAwayTime!)).toBeLessThan(1e-11);
        else if (r2 <= 2) expect(closed.farAwayTime).toBeNull();
      }),
      { numRuns: 60 },
    );
  });

  it('drop from rest at r₁ (cycloid, MTW 1973 eq. 31.10): τ, t and T', () => {
    fc.assert(
      fc.property(fc.double({ min: 2.01, max: 1e4, noNaN: true }), fc.double({ min: 0, max: 0.999, noNaN: true }), (r1, k) => {
        const r2 = r1 * k;
        const req = { r1, r2, theta: 0.4, start: { kind: 'rest' as const } };
        const closed = ok(freeFall(S, req));
        const quad = ok(freeFall(S, req, { method: 'quadrature' }));
        expect(closed.method).toBe('closedForm');
        expect(rel(closed.properTime, quad.properTime)).toBeLessThan(1e-11);
        expect(rel(closed.riverTime!, quad.riverTime!)).toBeLessThan(1e-11);
        if (r2 > 2.001) expect(rel(closed.farAwayTime!, quad.farAwayTime!)).toBeLessThan(1e-11);
      }),
      { numRuns: 60 },
    );
  });

  it('the exported closed forms agree with freeFall', () => {
    expect(riverFrameProperTime(10, 3)).toBe(ok(freeFall(S, { r1: 10, r2: 3, theta: 1, start: { kind: 'restAtInfinity' } })).properTime);
    const d = schwarzschildDropFromRest(10, 3);
    const f = ok(freeFall(S, { r1: 10, r2: 3, theta: 1, start: { kind: 'rest' } }));
    expect([d.properTime, d.farAwayTime, d.riverTime]).toEqual([f.properTime, f.farAwayTime, f.riverTime]);
  });
});

describe('published values', () => {
  const S = { a: 0, q: 0 };
  it('longest proper time from the horizon to the singularity is π M (MTW 1973, ch. 31; section from memory)', () => {
    const f = ok(freeFall(S, { r1: 2, r2: 0, theta: 1, start: { kind: 'rest' } }));
    expect(f.energy).toBe(0);
    expect(rel(f.properTime, Math.PI)).toBeLessThanOrEqual(1e-15);
    expect(f.farAwayTime).toBeNull();
    expect(f.riverTimeReason).toBe('startsOnHorizon');
    // The same limit by quadrature.
    expect(rel(ok(freeFall(S, { r1: 2, r2: 0, theta: 1, start: { kind: 'rest' } }, { method: 'quadrature' })).properTime, Math.PI)).toBeLessThan(1e-12);
  });

  it('≈ 15.5 µs for one solar mass (GM_sun = 1.3271244e20 m³/s², IAU 2015 Resolution B3)', () => {
    const gmSunOverC3 = 1.3271244e20 / 299792458 ** 3;
    // GM_sun/c³ = 4.925490947641267e-6 s (IAU 2015 B3 GM_sun with the exact SI c).
    expect(rel(gmSunOverC3, 4.925490947641267e-6)).toBeLessThan(1e-15);
    const f = ok(freeFall(S, { r1: 2, r2: 0, theta: 1, start: { kind: 'rest' } }));
    const seconds = f.properTime * gmSunOverC3;
    expect(seconds).toBeGreaterThan(15.45e-6);
    expect(seconds).toBeLessThan(15.55e-6);
  });

  it('from rest at infinity, horizon to singularity takes (4/3) M (MTW 1973, ch. 31, from memory)', () => {
    for (const method of ['auto', 'quadrature'] as const) {
      const f = ok(freeFall(S, { r1: 2, r2: 0, theta: 1, start: { kind: 'restAtInfinity' } }, { method }));
      expect(rel(f.properTime, 4 / 3)).toBeLessThan(1e-12);
    }
  });

  it('circular orbits in Schwarzschild: t = 2π r^{3/2} per revolution, dτ/dt = √(1 − 3M/r) (MTW 1973, ch. 25, from memory)', () => {
    fc.assert(
      fc.property(fc.double({ min: 3.01, max: 1e6, noNaN: true }), fc.double({ min: 0.1, max: 1e3, noNaN: true }), (r, n) => {
        const rev = circularOrbitRevolutions(S, r, 'prograde', n);
        if (!('properTime' in rev)) throw new Error('absent');
        expect(rel(rev.farAwayTime, 2 * Math.PI * n * r ** 1.5)).toBeLessThan(1e-13);
        expect(rel(rev.properTime, rev.farAwayTime * Math.sqrt(1 - 3 / r))).toBeLessThan(1e-12);
        expect(rel(rev.lag, rev.farAwayTime - rev.properTime)).toBeLessThan(1e-9);
      }),
    );
  });
});

describe('free-fall physics and refusals', () => {
  it('E = γ × lapse for a launch measured by the static observer (a = 0)', () => {
    const r1 = 10;
    const v = 0.6;
    const f = ok(freeFall({ a: 0, q: 0.5 }, { r1, r2: 4, theta: 2, start: { kind: 'launch', speed: v, direction: 'inward' } }));
    const lapse = Math.sqrt(1 - 2 / r1 + 0.25 / (r1 * r1));
    expect(rel(f.energy, lapse / Math.sqrt(1 - v * v))).toBeLessThan(1e-15);
  });

  it('with spin, rest and launch speed are relative to the ZAMO, and the note says so', () => {
    const s = { a: 0.9, q: 0 };
    const f = ok(freeFall(s, { r1: 6, r2: 3, theta: Math.PI / 2, start: { kind: 'launch', speed: 0.3, direction: 'inward' } }));
    expect(f.notes.some((n) => n.includes('ZAMO'))).toBe(true);
    const z = stationaryObserver(s, { kind: 'zamo', r: 6, theta: Math.PI / 2 }) as Observer;
    expect(rel(f.energy, z.rate / Math.sqrt(1 - 0.09))).toBeLessThan(1e-14);
    const axis = ok(freeFall(s, { r1: 6, r2: 3, theta: 0, start: { kind: 'rest' } }));
    expect(axis.geometry).toBe('axis');
    expect(rel(axis.energy, Math.sqrt((36 - 12 + 0.81) / (36 + 0.81)))).toBeLessThan(1e-15);
  });

  it('an outward launch below escape speed turns back at r_max = 2M/(1 − E²) (Schwarzschild)', () => {
    const r1 = 10;
    const v = 0.3;
    const e2 = (1 - 2 / r1) / (1 - v * v);
    const rMax = 2 / (1 - e2);
    const refused = freeFall({ a: 0, q: 0 }, { r1, r2: rMax * 1.01, theta: 1, start: { kind: 'launch', speed: v, direction: 'outward' } });
    expect(refused).toMatchObject({ ok: false, reason: 'turnsBack' });
    if (!refused.ok) expect(rel(refused.turningRadius!, rMax)).toBeLessThan(1e-12);
    const reached = ok(freeFall({ a: 0, q: 0 }, { r1, r2: rMax * 0.99, theta: 1, start: { kind: 'launch', speed: v, direction: 'outward' } }));
    expect(reached.direction).toBe('outward');
    expect(reached.farAwayTime).toBeGreaterThan(reached.properTime);
    // At escape speed the launch reaches any radius.
    const esc = Math.sqrt(2 / r1);
    expect(freeFall({ a: 0, q: 0 }, { r1, r2: 1e6, theta: 1, start: { kind: 'launch', speed: esc, direction: 'outward' } }).ok).toBe(true);
  });

  it('Reissner–Nordström: the infall from rest turns back inside the inner horizon where E² = f', () => {
    const q2 = 0.64;
    const e2 = 1 - 2 / 10 + q2 / 100;
    // (E² − 1) r² + 2r − Q² = 0, inner root, in the cancellation-free form.
    const rTurn = (2 * q2) / (2 + Math.sqrt(4 + 4 * (e2 - 1) * q2));
    const refused = freeFall({ a: 0, q: 0.8 }, { r1: 10, r2: rTurn * 0.999, theta: 1, start: { kind: 'rest' } });
    expect(refused).toMatchObject({ ok: false, reason: 'turnsBack' });
    if (!refused.ok) expect(rel(refused.turningRadius!, rTurn)).toBeLessThan(1e-12);
    const through = ok(freeFall({ a: 0, q: 0.8 }, { r1: 10, r2: rTurn * 1.001, theta: 1, start: { kind: 'rest' } }));
    expect(through.farAwayTime).toBeNull();
    expect(through.farAwayTimeReason).toBe('reachesHorizon');
    expect(through.riverTime).toBeGreaterThan(through.properTime);
  });

  it('river time is null where the path enters 2r < Q² (a fast infall into a charged hole)', () => {
    const f = ok(freeFall({ a: 0, q: 0.8 }, { r1: 10, r2: 0.2, theta: 1, start: { kind: 'launch', speed: 0.99, direction: 'inward' } }));
    expect(f.riverTime).toBeNull();
    expect(f.riverTimeReason).toBe('noRiverTime');
    expect(f.properTime).toBeGreaterThan(0);
  });

  it('far-away time diverges logarithmically at the horizon with coefficient 1/(2κ) = 2M (Schwarzschild)', () => {
    const t = (d: number) => ok(freeFall({ a: 0, q: 0 }, { r1: 10, r2: 2 + d, theta: 1, start: { kind: 'rest' } }, { method: 'quadrature' })).farAwayTime!;
    // t(2 + δ) ≈ −2 ln δ + const + O(δ): the difference over δ = 1e-6 → 1e-9 is 2 ln 1000.
    expect(Math.abs(t(1e-9) - t(1e-6) - 2 * Math.log(1000))).toBeLessThan(1e-4);
  });

  it('refuses what does not exist, with a typed reason', () => {
    const kerr = { a: 0.7, q: 0 };
    const reason = (r: FreeFallResult) => (r.ok ? 'ok' : r.reason);
    expect(reason(freeFall(kerr, { r1: 10, r2: 3, theta: 1, start: { kind: 'rest' } }))).toBe('unsupportedGeometry');
    expect(reason(freeFall(kerr, { r1: 1.5, r2: 1, theta: 0, start: { kind: 'rest' } }))).toBe('startInsideHorizon');
    expect(
      reason(freeFall(kerr, { r1: 1.5, r2: 1, theta: 0, start: { kind: 'launch', speed: 0.1, direction: 'inward' } })),
    ).toBe('startInsideHorizon');
    expect(reason(freeFall(kerr, { r1: 10, r2: 12, theta: 0, start: { kind: 'restAtInfinity' } }))).toBe('wrongDirection');
    expect(
      reason(freeFall(kerr, { r1: 10, r2: 12, theta: 0, start: { kind: 'launch', speed: 0.1, direction: 'inward' } })),
    ).toBe('wrongDirection');
    expect(reason(freeFall(kerr, { r1: 10, r2: 12, theta: 0, start: { kind: 'rest' } }))).toBe('turnsBack');
    expect(reason(freeFall({ a: 0, q: 0.8 }, { r1: 0.3, r2: 0.1, theta: 0, start: { kind: 'restAtInfinity' } }))).toBe(
      'startUnreachable',
    );
    for (const bad of [
      { r1: Number.NaN, r2: 1 },
      { r1: 0, r2: 1 },
      { r1: 10, r2: -1 },
      { r1: 10, r2: Number.POSITIVE_INFINITY },
    ]) {
      expect(reason(freeFall(kerr, { ...bad, theta: 0, start: { kind: 'rest' } }))).toBe('invalidInput');
    }
    expect(
      reason(freeFall(kerr, { r1: 10, r2: 3, theta: 0, start: { kind: 'launch', speed: 1, direction: 'inward' } })),
    ).toBe('invalidInput');
    expect(reason(freeFall(kerr, { r1: 10, r2: 3, theta: 0, start: { kind: 'rest' } }, { relativeTolerance: 0 }))).toBe('invalidInput');
  });

  it('an empty interval is zero, and a looser tolerance is honoured and reported', () => {
    const f = ok(freeFall({ a: 0.5, q: 0.2 }, { r1: 5, r2: 5, theta: 0, start: { kind: 'rest' } }));
    expect([f.properTime, f.riverTime, f.farAwayTime, f.direction]).toEqual([0, 0, 0, 'none']);
    const loose = ok(freeFall({ a: 0.5, q: 0.2 }, { r1: 8, r2: 3, theta: 0, start: { kind: 'rest' } }, { relativeTolerance: 1e-6 }));
    const tight = ok(freeFall({ a: 0.5, q: 0.2 }, { r1: 8, r2: 3, theta: 0, start: { kind: 'rest' } }));
    expect(loose.tolerance).toBe(1e-6);
    expect(loose.evaluations).toBeLessThanOrEqual(tight.evaluations);
    expect(rel(loose.properTime, tight.properTime)).toBeLessThan(1e-6);
  });
});

describe('stationary clocks', () => {
  it('τ = rate · t and back, with the lag t − τ = offset · t free of cancellation', () => {
    const o = stationaryObserver({ a: 0, q: 0 }, { kind: 'static', r: 1.4381277736563988e9, theta: Math.PI / 2 }) as Observer;
    const day = 86400 / 1.4790e-11; // one day in GM_earth/c³ (approximately; only ratios are tested)
    const fwd = stationaryProperTime(o, day);
    expect(fwd.properTime).toBe(o.rate * day);
    expect(fwd.lag).toBe(o.offset * day);
    // The lag over a day is ~60 µs worth of t: 6.95e-10 of it, with all digits.
    expect(rel(fwd.lag / day, 1 / 1.4381277736563988e9)).toBeLessThan(1e-9);
    const back = stationaryFarAwayTime(o, fwd.properTime);
    expect(rel(back.farAwayTime, day)).toBeLessThan(1e-15);
    expect(rel(back.lag, fwd.lag)).toBeLessThan(1e-9);
  });

  it('circular-orbit revolutions are refused where the orbit does not exist', () => {
    const r = circularOrbitRevolutions({ a: 0, q: 0 }, 2.9, 'prograde', 1);
    expect(r).toMatchObject({ exists: false, reason: 'insidePhotonOrbit' });
    expect(circularOrbitRevolutions({ a: 0, q: 0 }, 10, 'prograde', 0)).toMatchObject({ exists: false, reason: 'invalidInput' });
  });
});
