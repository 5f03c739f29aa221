/**
 * Stationary observers: against test/fixtures/python/proper_time.py (rates, offsets, velocities and the
 * log-rate split evaluated from the metric components at 40 digits; circular orbits from the general
 * root formula; the 1 cm Earth case at 50 digits), against the Kerr–Newman core, and their identities.
 */
import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  circularOrbitAngularVelocity,
  compareClocks,
  distantObserver,
  gravitationalLogRatio,
  signalFrequencyRatio,
  stationaryObserver,
  type Observer,
  type ObserverResult,
} from '../../src/physics/observers.js';
import {
  boyerLindquistMetric,
  pointFunctions,
  staticClockOffset,
  staticClockRate,
  zamoClockOffset,
  zamoClockRate,
  type KerrNewman,
} from '../../src/physics/spacetime.js';

type N = number | null;
interface ObserverCase {
  a: number;
  q: number;
  r: number;
  theta?: number;
  kind?: 'static' | 'zamo' | 'rotating';
  direction?: 'prograde' | 'retrograde';
  exists: boolean;
  reason?: string;
  angularVelocity?: number;
  rate?: number;
  offset?: number;
  logRate?: number;
  energy?: number;
  angularMomentum?: number;
  velocityRelativeToZamo?: N;
  velocityRelativeToStatic?: N;
  lorentzFactorStatic?: N;
  gravitational?: N;
  motion?: N;
  frameDragging?: N;
}
interface EarthCase {
  a: number;
  rA: number;
  rB: number;
  thetaA: number;
  thetaB: number;
  fractionalOffset: number;
  logRatio: number;
  signalShift: number;
}

const fixture = JSON.parse(readFileSync(new URL('../fixtures/proper_time.json', import.meta.url), 'utf8')) as {
  dps: number;
  earthDps: number;
  stationary: ObserverCase[];
  circular: ObserverCase[];
  earth: EarthCase[];
};

// 1e-12 relative: closed-form expressions with a handful of roundings each, against 40-digit values
// for the same double inputs. `floor` is the absolute scale below which a value counts as zero.
const REL = 1e-12;
function close(what: string, actual: number | null | undefined, expected: N | undefined, floor = 1e-300): void {
  if (expected === null || expected === undefined) {
    expect(actual ?? null, `${what}: expected no value`).toBeNull();
    return;
  }
  expect(actual, `${what}: expected ${expected}`).not.toBeNull();
  const tol = REL * Math.max(Math.abs(expected), floor);
  expect(Math.abs((actual as number) - expected), `${what}: ${actual} vs ${expected}`).toBeLessThanOrEqual(tol);
}

function mustExist(o: ObserverResult): Observer {
  if (!o.exists) throw new Error(`observer absent: ${o.reason}`);
  return o;
}

function compareWithFixture(o: ObserverResult, c: ObserverCase): void {
  if (!c.exists) {
    expect(o.exists).toBe(false);
    if (!o.exists) expect(o.reason).toBe(c.reason);
    return;
  }
  const ob = mustExist(o);
  close('angularVelocity', ob.angularVelocity, c.angularVelocity, 1e-300);
  close('rate', ob.rate, c.rate);
  close('offset', ob.offset, c.offset);
  close('logRate', ob.logRate, c.logRate);
  close('energy', ob.energy, c.energy);
  // L vanishes for static observers and ZAMOs in Schwarzschild; on the scale of r (units of M).
  close('angularMomentum', ob.angularMomentum, c.angularMomentum, 1e-16 * c.r);
  close('velocityRelativeToZamo', ob.velocityRelativeToZamo, c.velocityRelativeToZamo, 1e-16);
  close('velocityRelativeToStatic', ob.velocityRelativeToStatic, c.velocityRelativeToStatic, 1e-16);
  close('lorentzFactorStatic', ob.lorentzFactorStatic, c.lorentzFactorStatic);
  close('gravitational', ob.split?.gravitational, c.gravitational);
  // Motion and frame-dragging parts are exactly 0 for Ω = 0; the fixture has 40-digit noise there
  // (1e-41), far below this floor.
  close('motion', ob.split?.motion, c.motion, 1e-16);
  close('frameDragging', ob.split?.frameDragging, c.frameDragging, 1e-16);
}

describe('stationary observers against the mpmath fixture', () => {
  it('has real grids to test', () => {
    expect(fixture.dps).toBeGreaterThanOrEqual(30);
    expect(fixture.stationary.length).toBeGreaterThan(100);
    expect(fixture.stationary.some((c) => !c.exists && c.reason === 'ergoregion')).toBe(true);
    expect(fixture.circular.some((c) => !c.exists)).toBe(true);
  });

  for (const c of fixture.stationary) {
    it(`${c.kind} a=${c.a} q=${c.q} r=${c.r} θ=${c.theta}${c.kind === 'rotating' ? ` Ω=${c.angularVelocity}` : ''}`, () => {
      const s = { a: c.a, q: c.q };
      const theta = c.theta as number;
      const o =
        c.kind === 'rotating'
          ? stationaryObserver(s, { kind: 'rotating', r: c.r, theta, angularVelocity: c.angularVelocity as number })
          : stationaryObserver(s, { kind: c.kind as 'static' | 'zamo', r: c.r, theta });
      compareWithFixture(o, c);
    });
  }

  for (const c of fixture.circular) {
    it(`circular ${c.direction} a=${c.a} q=${c.q} r=${c.r}`, () => {
      const o = stationaryObserver({ a: c.a, q: c.q }, { kind: 'circular', r: c.r, direction: c.direction! });
      compareWithFixture(o, c);
    });
  }
});

describe('clock comparisons at the Earth (fixture at 50 digits)', () => {
  for (const c of fixture.earth) {
    it(`1 cm of height, a=${c.a}, θ_A=${c.thetaA}, θ_B=${c.thetaB}`, () => {
      const s = { a: c.a, q: 0 };
      const a = mustExist(stationaryObserver(s, { kind: 'static', r: c.rA, theta: c.thetaA }));
      const b = mustExist(stationaryObserver(s, { kind: 'static', r: c.rB, theta: c.thetaB }));
      const cmp = compareClocks(s, a, b);
      // 1e-14 relative on an offset of 1.1e-18 out of rates 1 − 7e-10: possible only because the
      // difference of μ/Σ is formed structurally (a few roundings of the offset itself).
      expect(Math.abs(cmp.fractionalOffset - c.fractionalOffset)).toBeLessThanOrEqual(1e-14 * Math.abs(c.fractionalOffset));
      expect(Math.abs(cmp.logRatio - c.logRatio)).toBeLessThanOrEqual(1e-14 * Math.abs(c.logRatio));
      expect(cmp.parts?.motion).toBe(0);
      expect(cmp.parts?.frameDragging).toBe(0);
      const sig = signalFrequencyRatio(s, a, b)!;
      expect(Math.abs(sig.shift - c.signalShift)).toBeLessThanOrEqual(1e-14 * Math.abs(c.signalShift));
      expect(sig.redshift).toBe(cmp.fractionalOffset);
    });
  }

  it('the naive difference of the two rates would have lost most digits (why the structure matters)', () => {
    const c = fixture.earth[0]!;
    const s = { a: 0, q: 0 };
    const naive = staticClockRate(pointFunctions(s, c.rB, c.thetaB)) / staticClockRate(pointFunctions(s, c.rA, c.thetaA)) - 1;
    expect(Math.abs(naive - c.fractionalOffset) / c.fractionalOffset).toBeGreaterThan(1e-3);
  });

  it('accepts the height difference directly, keeping it exact', () => {
    const s = { a: 0, q: 0 };
    const rg = 3.986004418e14 / 299792458 ** 2; // GM/c² of the Earth in metres (IERS 2010 GM)
    const rA = 6378137 / rg;
    const dr = 0.01 / rg;
    const g = gravitationalLogRatio(s, rA, Math.PI / 2, rA + dr, Math.PI / 2, dr);
    // Weak field: ln ratio ≈ g h / c² (1 + O(2M/r)); g h/c² = M dr / r² in units of M.
    expect(Math.abs(g / (dr / (rA * rA)) - 1)).toBeLessThan(3e-9);
  });
});

describe('observers against the Kerr–Newman core and their identities', () => {
  const bh = fc
    .tuple(fc.double({ min: 0, max: 0.99, noNaN: true }), fc.double({ min: 0, max: Math.PI / 2, noNaN: true }))
    .map(([k, phi]): KerrNewman => ({ a: k * Math.cos(phi), q: k * Math.sin(phi) }));
  const radius = fc.double({ min: 2.5, max: 1e6, noNaN: true });
  const theta = fc.double({ min: 0.01, max: Math.PI - 0.01, noNaN: true });
  const near = (x: number, y: number, rel = REL) => Math.abs(x - y) <= rel * Math.max(Math.abs(x), Math.abs(y), 1e-300);

  it('static and ZAMO rates and offsets equal the core’s', () => {
    fc.assert(
      fc.property(bh, radius, theta, (s, r, th) => {
        const p = pointFunctions(s, r, th);
        const st = stationaryObserver(s, { kind: 'static', r, theta: th });
        if (st.exists) {
          expect(near(st.rate, staticClockRate(p))).toBe(true);
          expect(near(st.offset, staticClockOffset(p))).toBe(true);
        }
        const z = mustExist(stationaryObserver(s, { kind: 'zamo', r, theta: th }));
        expect(near(z.rate, zamoClockRate(p))).toBe(true);
        expect(near(z.offset, zamoClockOffset(p))).toBe(true);
      }),
    );
  });

  it('1 − N equals the term-by-term expansion x − 2Ω a sin²θ x + Ω² g_φφ', () => {
    fc.assert(
      fc.property(bh, radius, theta, fc.double({ min: -1, max: 1, noNaN: true }), (s, r, th, k) => {
        const p = pointFunctions(s, r, th);
        const g = boyerLindquistMetric(s, p);
        // Ω up to the speed of light for a circle of radius √g_φφ.
        const omega = (0.9 * k) / Math.sqrt(g.phph);
        const o = stationaryObserver(s, { kind: 'rotating', r, theta: th, angularVelocity: omega });
        const x = p.mu / p.sigma;
        const expanded = x - 2 * omega * s.a * p.sin2 * x + omega * omega * g.phph;
        if (!o.exists) {
          expect(expanded).toBeGreaterThanOrEqual(1 - 1e-12);
          return;
        }
        // The expansion may cancel (that is why it is not used); compare on the scale of its terms.
        const scale = x + Math.abs(2 * omega * s.a * p.sin2 * x) + omega * omega * g.phph;
        expect(Math.abs(1 - o.rate * o.rate - expanded)).toBeLessThanOrEqual(1e-13 * Math.max(scale, 1));
        // The three parts add up to ln(dτ/dt). ln(rate²) = ln(1 − y) has condition number y/(1 − y) =
        // (1 − rate²)/rate²: near the speed of light (rate → 0) either side carries ~ε/rate² of rounding
        // (seen: 3.5e-14 at rate 0.075), so that term joins the 1e-14 relative floor.
        if (o.split) {
          const sum = o.split.gravitational + o.split.frameDragging + o.split.motion;
          const tol = 1e-14 * Math.max(Math.abs(o.logRate), 1e-3) + (4 * Number.EPSILON) / (o.rate * o.rate);
          expect(Math.abs(sum - o.logRate)).toBeLessThanOrEqual(tol);
        }
        // u is a unit timelike vector: g_μν u^μ u^ν = −1.
        const u = o.fourVelocity;
        const norm = g.tt * u.t * u.t + 2 * g.tphi * u.t * u.phi + g.phph * u.phi * u.phi;
        expect(Math.abs(norm + 1)).toBeLessThanOrEqual(1e-12 * u.t * u.t * Math.max(1, Math.abs(g.tt), g.phph * omega * omega));
      }),
    );
  });

  it('circular-orbit Ω is the root of ∂_r g_tt + 2Ω ∂_r g_tφ + Ω² ∂_r g_φφ = 0 (general formula)', () => {
    fc.assert(
      fc.property(bh, fc.double({ min: 1.5, max: 1e4, noNaN: true }), fc.boolean(), (s, r, pro) => {
        const q2 = s.q * s.q;
        // Equatorial metric derivatives: ∂_r(μ/r²) = −2/r² + 2Q²/r³.
        const dx = -2 / (r * r) + (2 * q2) / (r * r * r);
        const dtt = dx;
        const dtp = -s.a * dx;
        const dpp = 2 * r + s.a * s.a * dx;
        const root = Math.sqrt(dtp * dtp - dtt * dpp);
        const general = pro ? (-dtp + root) / dpp : (-dtp - root) / dpp;
        const closed = circularOrbitAngularVelocity(s, r, pro ? 'prograde' : 'retrograde');
        expect(near(closed, general, 1e-11)).toBe(true);
      }),
    );
  });

  it('Kerr circular orbits: E and L from the Bardeen–Press–Teukolsky closed forms', () => {
    // Bardeen, Press & Teukolsky 1972, ApJ 178, 347, eqs. (2.12)–(2.13) (recalled from memory):
    // E = (r^{3/2} − 2r^{1/2} ± a)/(r^{3/4} √(r^{3/2} − 3r^{1/2} ± 2a)),
    // L = ±(r² ∓ 2a r^{1/2} + a²)/(r^{3/4} √(r^{3/2} − 3r^{1/2} ± 2a)).
    fc.assert(
      fc.property(fc.double({ min: 0, max: 0.999, noNaN: true }), fc.double({ min: 10, max: 1e4, noNaN: true }), fc.boolean(), (a, r, pro) => {
        const sg = pro ? 1 : -1;
        const o = mustExist(stationaryObserver({ a, q: 0 }, { kind: 'circular', r, direction: pro ? 'prograde' : 'retrograde' }));
        const sq = Math.sqrt(r);
        const den = r ** 0.75 * Math.sqrt(r * sq - 3 * sq + sg * 2 * a);
        expect(near(o.energy, (r * sq - 2 * sq + sg * a) / den, 1e-12)).toBe(true);
        expect(near(o.angularMomentum, (sg * (r * r - sg * 2 * a * sq + a * a)) / den, 1e-12)).toBe(true);
      }),
    );
  });

  it('a ZAMO’s clock runs faster than the static clock beside it, through the frame-dragging part', () => {
    const s = { a: 0.9, q: 0 };
    const st = mustExist(stationaryObserver(s, { kind: 'static', r: 3, theta: Math.PI / 2 }));
    const z = mustExist(stationaryObserver(s, { kind: 'zamo', r: 3, theta: Math.PI / 2 }));
    expect(z.rate).toBeGreaterThan(st.rate);
    expect(z.velocityRelativeToStatic!).toBeGreaterThan(0);
    expect(z.split!.motion).toBeLessThan(0);
    expect(z.split!.frameDragging).toBeGreaterThan(-z.split!.motion);
    const cmp = compareClocks(s, st, z);
    expect(cmp.fractionalOffset).toBeGreaterThan(0);
    expect(cmp.parts!.gravitational).toBe(0);
  });

  it('a ground clock on the spinning Earth: motion part ≈ −(ΩR)²/2c², frame dragging ~1e-21', () => {
    const rg = 3.986004418e14 / 299792458 ** 2; // m, IERS 2010 GM
    const tg = rg / 299792458; // s
    const omega = 7.292115e-5 * tg; // IERS 2010 nominal rotation rate, in c³/(GM)
    const r = 6378137 / rg;
    const s = { a: 738, q: 0 }; // a/M of the Earth preset (src/units/presets.ts)
    const ground = mustExist(stationaryObserver(s, { kind: 'rotating', r, theta: Math.PI / 2, angularVelocity: omega }));
    const v = omega * r; // ΩR/c
    // Special relativity to leading order; corrections O(v⁴, v² M/r) ~ 1e-21 of 1.2e-12.
    expect(Math.abs(ground.split!.motion / (-0.5 * v * v) - 1)).toBeLessThan(1e-8);
    expect(ground.split!.frameDragging).toBeGreaterThan(0);
    expect(ground.split!.frameDragging).toBeLessThan(1e-20);
    // The whole offset is the static one plus the motion: 6.97e-10 + 1.2e-12.
    expect(ground.offset).toBeGreaterThan(6.9e-10);
  });

  it('distant observer: rate 1 and comparisons against it give the observer’s own log-rate', () => {
    const s = { a: 0.5, q: 0.3 };
    const d = distantObserver();
    expect(stationaryObserver(s, { kind: 'distant' })).toEqual(d);
    const st = mustExist(stationaryObserver(s, { kind: 'static', r: 10, theta: 1 }));
    const cmp = compareClocks(s, d, st);
    expect(near(cmp.logRatio, st.logRate, 1e-14)).toBe(true);
    expect(near(cmp.ratio, st.rate, 1e-14)).toBe(true);
    const up = signalFrequencyRatio(s, st, d)!;
    // Light climbing out is redshifted: received/emitted = rate(emitter)/1.
    expect(near(up.ratio, st.rate, 1e-14)).toBe(true);
    expect(signalFrequencyRatio(s, st, mustExist(stationaryObserver(s, { kind: 'zamo', r: 10, theta: 1 })))).toBeNull();
  });
});

describe('where observers do not exist', () => {
  const reason = (o: ObserverResult) => (o.exists ? 'exists' : o.reason);
  it('inside and on the outer horizon, for every kind', () => {
    const s = { a: 0.6, q: 0.3 };
    const rp = 1 + Math.sqrt(1 - 0.36 - 0.09);
    for (const kind of ['static', 'zamo'] as const) {
      expect(reason(stationaryObserver(s, { kind, r: rp * 0.9, theta: 1 }))).toBe('insideHorizon');
      expect(reason(stationaryObserver(s, { kind, r: rp, theta: 1 }))).toBe('onHorizon');
    }
    expect(reason(stationaryObserver(s, { kind: 'circular', r: 1, direction: 'prograde' }))).toBe('insideHorizon');
    expect(reason(stationaryObserver(s, { kind: 'rotating', r: 1, theta: 1, angularVelocity: 0.1 }))).toBe('insideHorizon');
  });

  it('static inside the ergosurface, ZAMO still there', () => {
    const s = { a: 0.9, q: 0 };
    expect(reason(stationaryObserver(s, { kind: 'static', r: 1.8, theta: Math.PI / 2 }))).toBe('ergoregion');
    expect(reason(stationaryObserver(s, { kind: 'static', r: 2, theta: Math.PI / 2 }))).toBe('ergoregion');
    expect(reason(stationaryObserver(s, { kind: 'zamo', r: 1.8, theta: Math.PI / 2 }))).toBe('exists');
  });

  it('rotating at or beyond the speed of light', () => {
    expect(reason(stationaryObserver({ a: 0, q: 0 }, { kind: 'rotating', r: 10, theta: Math.PI / 2, angularVelocity: 0.1 }))).toBe(
      'fasterThanLight',
    );
    expect(reason(stationaryObserver({ a: 0, q: 0 }, { kind: 'rotating', r: 10, theta: Math.PI / 2, angularVelocity: 0.05 }))).toBe(
      'exists',
    );
  });

  it('circular orbits: at/inside the photon orbit, off the equator, and where r ≤ Q²', () => {
    // Schwarzschild photon sphere r = 3M (MTW 1973, ch. 25; from memory).
    expect(reason(stationaryObserver({ a: 0, q: 0 }, { kind: 'circular', r: 3, direction: 'prograde' }))).toBe('insidePhotonOrbit');
    expect(reason(stationaryObserver({ a: 0, q: 0 }, { kind: 'circular', r: 3.0001, direction: 'prograde' }))).toBe('exists');
    expect(reason(stationaryObserver({ a: 0, q: 0 }, { kind: 'circular', r: 10, direction: 'prograde', theta: 1 }))).toBe('notEquatorial');
    // A charged body without a horizon (Q = 2M): no attraction to hold an orbit at r ≤ Q².
    expect(reason(stationaryObserver({ a: 0, q: 2 }, { kind: 'circular', r: 3, direction: 'prograde' }))).toBe('noCircularOrbit');
  });

  it('invalid input is refused, not NaN', () => {
    for (const r of [Number.NaN, -1, 0, Number.POSITIVE_INFINITY]) {
      expect(reason(stationaryObserver({ a: 0, q: 0 }, { kind: 'static', r, theta: 1 }))).toBe('invalidInput');
    }
    expect(reason(stationaryObserver({ a: 0, q: 0 }, { kind: 'static', r: 10, theta: 4 }))).toBe('invalidInput');
    expect(
      reason(stationaryObserver({ a: 0, q: 0 }, { kind: 'rotating', r: 10, theta: 1, angularVelocity: Number.NaN })),
    ).toBe('invalidInput');
    const absent = stationaryObserver({ a: 0, q: 0 }, { kind: 'static', r: 1, theta: 1 });
    expect(absent.exists).toBe(false);
    if (!absent.exists) expect(absent.message.length).toBeGreaterThan(20);
  });
});
