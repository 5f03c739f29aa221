/**
 * Circular equatorial orbits: against test/fixtures/python/orbits.py (characteristic radii found at 40
 * digits from the metric components alone; circular-orbit quantities with the epicyclic frequencies
 * from exact second derivatives of the geodesic potential), against the Kerr and Reissner–Nordström
 * closed forms (the general root-finding path must reproduce the Bardeen–Press–Teukolsky radii), as
 * properties over random black holes, and against published values (in their own block, each with
 * its source).
 */
import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  characteristicOrbit,
  characteristicOrbits,
  kerrIsco,
  kerrMarginallyBoundOrbit,
  kerrPhotonOrbit,
  type CharacteristicOrbit,
  type CharacteristicOrbitKind,
} from '../../src/physics/characteristic-orbits.js';
import { characteristicRadiiByRootFinding, MAX_ROOT_ITERATIONS, SCAN_CELLS } from '../../src/physics/orbit-roots.js';
import { circularOrbit, type CircularOrbit, type CircularOrbitResult, type OrbitDirection } from '../../src/physics/orbits.js';
import { circularOrbitAngularVelocity, stationaryObserver } from '../../src/physics/observers.js';
import { horizons, type KerrNewman } from '../../src/physics/spacetime.js';
import { C, GM_SUN } from '../../src/units/constants.js';

type N = number | null;
interface CharacteristicCase {
  a: number;
  q: number;
  direction: OrbitDirection;
  photonOrbit: number;
  photonOrbitAngularVelocity: number;
  marginallyBoundOrbit: number;
  marginallyBoundAngularMomentum: number;
  marginallyBoundAngularVelocity: number;
  isco: number;
  iscoEnergy: number;
  iscoBindingEnergy: number;
  iscoAngularMomentum: number;
  iscoAngularVelocity: number;
}
interface CircularCase {
  a: number;
  q: number;
  r: number;
  direction: OrbitDirection;
  exists: boolean;
  reason?: string;
  angularVelocity?: number;
  coordinatePeriod?: number;
  properPeriod?: number;
  clockRate?: number;
  energy?: number;
  bindingEnergy?: number;
  angularMomentum?: number;
  zamoSpeed?: number;
  zamoLorentzFactor?: number;
  radialEpicyclicFrequencySquared?: number;
  verticalEpicyclicFrequencySquared?: number;
  radialEpicyclicFrequency?: N;
  verticalEpicyclicFrequency?: N;
  periastronPrecession?: N;
  nodalPrecession?: N;
  periastronAdvancePerOrbit?: N;
  nodalAdvancePerOrbit?: N;
  radiallyStable?: boolean;
  verticallyStable?: boolean;
  bound?: boolean;
}

const fixture = JSON.parse(readFileSync(new URL('../fixtures/orbits.json', import.meta.url), 'utf8')) as {
  dps: number;
  symbolicChecks: string[];
  characteristic: CharacteristicCase[];
  circular: CircularCase[];
};

const DIRECTIONS: OrbitDirection[] = ['prograde', 'retrograde'];
const KINDS: CharacteristicOrbitKind[] = ['photonOrbit', 'marginallyBoundOrbit', 'isco'];
const sgn = (d: OrbitDirection) => (d === 'prograde' ? 1 : -1);
const relErr = (x: number, y: number) => Math.abs(x - y) / Math.max(Math.abs(y), 1e-300);

function close(what: string, actual: N | undefined, expected: N | undefined, rel: number, floor = 0): void {
  if (expected === null || expected === undefined) {
    expect(actual ?? null, `${what}: expected no value`).toBeNull();
    return;
  }
  expect(actual, `${what}: expected ${expected}`).toBeTypeOf('number');
  const tol = Math.max(rel * Math.abs(expected), floor);
  expect(Math.abs((actual as number) - expected), `${what}: ${actual} vs ${expected}`).toBeLessThanOrEqual(tol);
}

function mustExist<T extends { exists: boolean }>(o: T): Extract<T, { exists: true }> {
  if (!o.exists) throw new Error(`absent: ${JSON.stringify(o)}`);
  return o as Extract<T, { exists: true }>;
}

/** Black holes a² + Q² ≤ 1 (strictly inside, to stay off the degenerate extremal boundary). */
const blackHole = fc
  .tuple(fc.double({ min: 0, max: 0.999, noNaN: true }), fc.double({ min: 0, max: Math.PI / 2, noNaN: true }))
  .map(([k, phi]): KerrNewman => ({ a: k * Math.cos(phi), q: k * Math.sin(phi) }));
const direction = fc.constantFrom<OrbitDirection>('prograde', 'retrograde');

describe('characteristic radii against the mpmath fixture', () => {
  it('has real grids to test', () => {
    expect(fixture.dps).toBeGreaterThanOrEqual(30);
    expect(fixture.symbolicChecks.length).toBeGreaterThan(5);
    expect(fixture.characteristic.filter((c) => c.q > 0 && c.direction === 'retrograde').length).toBeGreaterThan(15);
    expect(fixture.characteristic.some((c) => c.a === 0 && c.q === 1)).toBe(true);
  });

  for (const c of fixture.characteristic) {
    it(`a=${c.a} Q=${c.q} ${c.direction}`, () => {
      const s = { a: c.a, q: c.q };
      const path = c.q === 0 ? 'closedForm' : 'rootFinding';
      // Radii: 1e-10 relative for root finding (the fixture's roots are 40-digit; the TypeScript
      // root finder stops at a bracket of 2ε|σ| with double-double residuals, ~1e-15 in practice,
      // and 1e-10 is the budget set for root-found values); 1e-12 for the Q = 0 closed forms
      // (a few roundings, the worst a factor-5 cancellation in the prograde ISCO near a = 1).
      const rTol = path === 'rootFinding' ? 1e-10 : 1e-12;
      const ph = mustExist(characteristicOrbit(s, 'photonOrbit', c.direction));
      const mb = mustExist(characteristicOrbit(s, 'marginallyBoundOrbit', c.direction));
      const isco = mustExist(characteristicOrbit(s, 'isco', c.direction));
      for (const o of [ph, mb, isco]) expect(o.method).toBe(path);
      close('photonOrbit', ph.r, c.photonOrbit, rTol);
      close('marginallyBoundOrbit', mb.r, c.marginallyBoundOrbit, rTol);
      close('isco', isco.r, c.isco, rTol);
      // Ω and the marginally bound L inherit the relative error of r (dΩ/dr ≠ 0; ×1.5 for Ω ∝ r^−3/2).
      close('photonOrbitAngularVelocity', ph.angularVelocity, c.photonOrbitAngularVelocity, 2 * rTol);
      close('marginallyBoundAngularVelocity', mb.angularVelocity, c.marginallyBoundAngularVelocity, 2 * rTol);
      close('marginallyBoundAngularMomentum', mb.angularMomentum, c.marginallyBoundAngularMomentum, 2 * rTol);
      close('iscoAngularVelocity', isco.angularVelocity, c.iscoAngularVelocity, 2 * rTol);
      // E and L are stationary at the ISCO (dE/dr = dL/dr = 0), so an error in r does not reach them:
      // 1e-12 relative (closed forms, a handful of roundings); 1 − E is formed without cancellation.
      close('iscoEnergy', isco.energy, c.iscoEnergy, 1e-12);
      close('iscoAngularMomentum', isco.angularMomentum, c.iscoAngularMomentum, 1e-12);
      close('iscoBindingEnergy', isco.bindingEnergy, c.iscoBindingEnergy, 1e-12);
      expect(mb.energy).toBe(1);
      expect(mb.bindingEnergy).toBe(0);
      expect(ph.energy).toBeNull();
      // The root-finding path on the Kerr cases as well.
      if (c.q === 0) {
        const g = characteristicRadiiByRootFinding(s, c.direction)!;
        close('photonOrbit (root finding)', g.photonOrbit.r, c.photonOrbit, 1e-10);
        close('marginallyBoundOrbit (root finding)', g.marginallyBoundOrbit.r, c.marginallyBoundOrbit, 1e-10);
        close('isco (root finding)', g.isco.r, c.isco, 1e-10);
      }
    });
  }
});

describe('the general (root-finding) path reproduces the Bardeen–Press–Teukolsky closed forms', () => {
  // 1e-12 relative, as required of the overlap: both sides are accurate to a few ulp (the closed
  // forms with the cancellation-free 3 − Z₁; the roots with double-double residuals).
  const REL = 1e-12;
  const check = (a: number, d: OrbitDirection) => {
    const g = characteristicRadiiByRootFinding({ a, q: 0 }, d)!;
    expect(relErr(g.photonOrbit.r, kerrPhotonOrbit(a, d)), `photon a=${a} ${d}`).toBeLessThanOrEqual(REL);
    expect(relErr(g.marginallyBoundOrbit.r, kerrMarginallyBoundOrbit(a, d)), `mb a=${a} ${d}`).toBeLessThanOrEqual(REL);
    expect(relErr(g.isco.r, kerrIsco(a, d)), `isco a=${a} ${d}`).toBeLessThanOrEqual(REL);
  };

  it('over random spins', () => {
    fc.assert(fc.property(fc.double({ min: 0, max: 1, noNaN: true }), direction, (a, d) => check(a, d)), { numRuns: 400 });
  });

  it('near extremality, where the three prograde orbits merge (a near-triple root of I)', () => {
    for (const a of [0.99, 0.999, 0.99999, 1 - 1e-8, 1 - 1e-12, 1 - 2 ** -52, 1e-3, 1e-8, 0]) {
      for (const d of DIRECTIONS) check(a, d);
    }
  });

  it('E and L at the ISCO: the general forms against BPT E = √(1 − 2/(3r)), L = ±(2/(3√3))(1 + 2√(3r − 2))', () => {
    // 1e-12: E and L from n/(r√D) and the BPT forms at the same radius; D ≥ 0.1 for a ≤ 0.99.
    fc.assert(
      fc.property(fc.double({ min: 0, max: 0.99, noNaN: true }), direction, (a, d) => {
        const r = kerrIsco(a, d);
        const o = mustExist(circularOrbit({ a, q: 0 }, r, d));
        const bpt = mustExist(characteristicOrbit({ a, q: 0 }, 'isco', d));
        expect(relErr(o.energy, bpt.energy!)).toBeLessThanOrEqual(1e-12);
        expect(relErr(o.angularMomentum, bpt.angularMomentum!)).toBeLessThanOrEqual(1e-12);
        expect(relErr(o.bindingEnergy, bpt.bindingEnergy!)).toBeLessThanOrEqual(1e-12);
      }),
      { numRuns: 200 },
    );
  });

  it('the Kerr closed forms reduce to each other and to Schwarzschild at a = 0, and are even in the direction there', () => {
    expect(kerrIsco(0, 'prograde')).toBe(6);
    expect(kerrIsco(0, 'retrograde')).toBe(6);
    expect(kerrMarginallyBoundOrbit(0, 'prograde')).toBe(4);
    expect(kerrPhotonOrbit(0, 'retrograde')).toBeCloseTo(3, 15);
  });
});

describe('existence, ordering and meaning of the characteristic orbits of every black hole', () => {
  it('all six exist, r₊ ≤ r_ph < r_mb < r_isco, within the search intervals, with bounded cost', () => {
    let most = 0;
    fc.assert(
      fc.property(blackHole, direction, (s, d) => {
        const g = characteristicRadiiByRootFinding(s, d)!;
        const rp = horizons(s)!.outer;
        expect(g.photonOrbit.r).toBeGreaterThanOrEqual(rp);
        expect(g.marginallyBoundOrbit.r).toBeGreaterThan(g.photonOrbit.r);
        expect(g.isco.r).toBeGreaterThan(g.marginallyBoundOrbit.r);
        expect(g.photonOrbit.r - s.q * s.q).toBeLessThan(2.5 ** 2);
        expect(g.isco.r - s.q * s.q).toBeLessThan(3.5 ** 2);
        for (const k of KINDS) {
          expect(g[k].method).toBe('rootFinding');
          expect(g[k].evaluations).toBeLessThanOrEqual(SCAN_CELLS + MAX_ROOT_ITERATIONS + 1);
          most = Math.max(most, g[k].evaluations);
        }
      }),
      { numRuns: 500 },
    );
    // Far below the bound: the scan (≤ 33) plus a few Brent steps.
    expect(most).toBeLessThan(80);
  });

  it('the radii mean what they say: D → 0, E = 1 and κ_r² changes sign there', () => {
    fc.assert(
      fc.property(blackHole, direction, (s, d) => {
        const g = characteristicRadiiByRootFinding(s, d)!;
        const up = (r: number) => r * (1 + 1e-7);
        const down = (r: number) => r * (1 - 1e-7);
        // Photon orbit: the timelike circular orbits end there.
        const justOut = mustExist(circularOrbit(s, up(g.photonOrbit.r), d));
        expect(justOut.energy).toBeGreaterThan(100);
        const justIn = circularOrbit(s, down(g.photonOrbit.r), d);
        if (down(g.photonOrbit.r) > horizons(s)!.outer) {
          expect(justIn.exists).toBe(false);
          if (!justIn.exists) expect(justIn.reason).toBe('insidePhotonOrbit');
        }
        // Marginally bound: bound just outside, unbound just inside.
        expect(mustExist(circularOrbit(s, up(g.marginallyBoundOrbit.r), d)).bound).toBe(true);
        expect(mustExist(circularOrbit(s, down(g.marginallyBoundOrbit.r), d)).bound).toBe(false);
        expect(Math.abs(mustExist(circularOrbit(s, g.marginallyBoundOrbit.r, d)).bindingEnergy)).toBeLessThan(1e-12);
        // ISCO: stable outside, unstable inside; E there is the minimum over circular orbits.
        const outside = mustExist(circularOrbit(s, up(g.isco.r), d));
        const inside = mustExist(circularOrbit(s, down(g.isco.r), d));
        expect(outside.radiallyStable).toBe(true);
        expect(inside.radiallyStable).toBe(false);
        expect(inside.radialEpicyclicFrequency).toBeNull();
        const at = mustExist(circularOrbit(s, g.isco.r, d));
        expect(at.energy).toBeLessThanOrEqual(outside.energy);
        expect(at.energy).toBeLessThanOrEqual(inside.energy);
        expect(at.bound).toBe(true);
      }),
      { numRuns: 200 },
    );
  });

  it('retrograde orbits lie outside prograde ones, and charge pulls every orbit inward (at fixed spin)', () => {
    fc.assert(
      fc.property(blackHole, (s) => {
        const o = characteristicOrbits(s);
        for (const k of KINDS) {
          const pro = mustExist(o[`${k}Prograde`]);
          const retro = mustExist(o[`${k}Retrograde`]);
          expect(retro.r).toBeGreaterThanOrEqual(pro.r * (1 - 1e-15));
          const uncharged = mustExist(characteristicOrbit({ a: s.a, q: 0 }, k, 'retrograde'));
          expect(retro.r).toBeLessThanOrEqual(uncharged.r * (1 + 1e-15));
        }
      }),
      { numRuns: 200 },
    );
  });

  it('extremal limits: every prograde orbit at r = 1 for a = 1; extremal Reissner–Nordström is regular', () => {
    for (const k of KINDS) {
      const closed = mustExist(characteristicOrbit({ a: 1, q: 0 }, k, 'prograde'));
      expect(closed.r).toBeCloseTo(1, 14); // closed forms at a = 1: exact up to a few roundings
      const g = characteristicRadiiByRootFinding({ a: 1, q: 0 }, 'prograde')!;
      expect(g[k].r).toBe(1);
      expect(g[k].method).toBe('lowerLimit');
    }
    // At the extremal Kerr ISCO, BPT's forms stay finite: E = 1/√3, L = 2/√3 (BPT 1972).
    const isco = mustExist(characteristicOrbit({ a: 1, q: 0 }, 'isco', 'prograde'));
    // 2e-15 relative: the BPT forms at r = 1 + 9e-16 (the closed-form radius, a few roundings).
    expect(relErr(isco.energy!, 1 / Math.sqrt(3))).toBeLessThanOrEqual(2e-15);
    expect(relErr(isco.angularMomentum!, 2 / Math.sqrt(3))).toBeLessThanOrEqual(2e-15);
    // Extremal Kerr–Newman with small spin: the prograde photon orbit leaves the horizon at r = 2 − 2a
    // (D = (σ − a)²(σ² + 2aσ − Q²) when a² + Q² = 1, derived here).
    const a = 0.25;
    const ph = mustExist(characteristicOrbit({ a, q: Math.sqrt(1 - a * a) }, 'photonOrbit', 'prograde'));
    expect(ph.r).toBeCloseTo(2 - 2 * a, 12);
    // Extremal Reissner–Nordström: r³ − 6r² + 9r − 4 = (r − 1)²(r − 4) and r³ − 4r² + 4r − 1 =
    // (r − 1)(r² − 3r + 1), so r_isco = 4, r_mb = (3 + √5)/2, and r_ph = 2 from r² − 3r + 2 = 0.
    const rn = characteristicOrbits({ a: 0, q: 1 });
    expect(mustExist(rn.iscoPrograde).r).toBeCloseTo(4, 14);
    expect(mustExist(rn.marginallyBoundOrbitRetrograde).r).toBeCloseTo((3 + Math.sqrt(5)) / 2, 14);
    expect(mustExist(rn.photonOrbitPrograde).r).toBeCloseTo(2, 14);
  });

  it('refuses naked singularities and non-finite input, with reasons', () => {
    const naked = characteristicOrbit({ a: 0.8, q: 0.8 }, 'isco', 'prograde');
    expect(naked.exists).toBe(false);
    if (!naked.exists) {
      expect(naked.reason).toBe('noHorizon');
      expect(naked.message).toMatch(/black holes/);
    }
    expect(characteristicRadiiByRootFinding({ a: 1.2, q: 0 }, 'prograde')).toBeNull();
    const bad = characteristicOrbit({ a: Number.NaN, q: 0 }, 'photonOrbit', 'retrograde');
    expect(bad.exists).toBe(false);
    if (!bad.exists) expect(bad.reason).toBe('invalidInput');
    const all = characteristicOrbits({ a: 0, q: 1.1 });
    for (const v of Object.values(all)) expect(v.exists).toBe(false);
  });

  it('the six keys of characteristicOrbits follow the quantity names', () => {
    expect(Object.keys(characteristicOrbits({ a: 0.5, q: 0.5 })).sort()).toEqual(
      [
        'iscoPrograde',
        'iscoRetrograde',
        'marginallyBoundOrbitPrograde',
        'marginallyBoundOrbitRetrograde',
        'photonOrbitPrograde',
        'photonOrbitRetrograde',
      ].sort(),
    );
  });
});

describe('circular orbits against the mpmath fixture', () => {
  it('has real grids to test', () => {
    const c = fixture.circular;
    expect(c.length).toBeGreaterThan(150);
    for (const reason of ['insidePhotonOrbit', 'insideHorizon', 'onHorizon', 'noCircularOrbit']) {
      expect(c.some((x) => !x.exists && x.reason === reason), reason).toBe(true);
    }
    expect(c.some((x) => x.exists && !x.radiallyStable)).toBe(true);
    expect(c.some((x) => x.exists && !x.bound)).toBe(true);
    expect(c.some((x) => x.exists && x.r > 1e9)).toBe(true);
  });

  for (const c of fixture.circular) {
    it(`a=${c.a} Q=${c.q} r=${c.r} ${c.direction}`, () => {
      const o = circularOrbit({ a: c.a, q: c.q }, c.r, c.direction);
      if (!c.exists) {
        expect(o.exists).toBe(false);
        if (!o.exists) expect(o.reason).toBe(c.reason);
        return;
      }
      const ob = mustExist(o);
      // 1e-12 relative: closed forms with a handful of roundings, none cancelling (1 − E and the
      // precessions are formed from their own numerators), against 40-digit values at the same inputs.
      const REL = 1e-12;
      const om = Math.abs(c.angularVelocity!);
      for (const key of [
        'angularVelocity',
        'coordinatePeriod',
        'properPeriod',
        'clockRate',
        'energy',
        'bindingEnergy',
        'angularMomentum',
        'zamoSpeed',
        'zamoLorentzFactor',
      ] as const) {
        close(key, ob[key], c[key], REL);
      }
      // κ² = Ω²(1 − X): 1 − X cancels near the ISCO (and near the vertical analogue), with an
      // absolute error of a few ε on the scale of Ω²; hence 1e-12 relative or 1e-12 Ω².
      close('radialEpicyclicFrequencySquared', ob.radialEpicyclicFrequencySquared, c.radialEpicyclicFrequencySquared, REL, REL * om * om);
      close('verticalEpicyclicFrequencySquared', ob.verticalEpicyclicFrequencySquared, c.verticalEpicyclicFrequencySquared, REL, REL * om * om);
      // κ itself: the same cancellation, halved by the square root (relative error of κ² / 2 ≤ 1e-12 /(1 − X)).
      close('radialEpicyclicFrequency', ob.radialEpicyclicFrequency, c.radialEpicyclicFrequency, REL, REL * om);
      close('verticalEpicyclicFrequency', ob.verticalEpicyclicFrequency, c.verticalEpicyclicFrequency, REL, REL * om);
      // Precessions |Ω| − κ = |Ω| X/(1 + √(1 − X)): full relative precision, also in weak fields (the
      // Earth case has X ≈ 4e-9, where |Ω| − κ would lose 8 digits). The nodal precession vanishes at
      // a = 0 exactly here and is ~1e-36 rounding noise in the fixture: absolute floor 1e-30 |Ω|.
      close('periastronPrecession', ob.periastronPrecession, c.periastronPrecession, REL, 1e-30 * om);
      close('nodalPrecession', ob.nodalPrecession, c.nodalPrecession, REL, 1e-30 * om);
      // Per-orbit advances 2π(|Ω| − κ)/κ diverge as κ → 0 at the ISCO; the fixture's nearest case has
      // 1 − X ≈ 0.02, where κ's relative error is ≤ 1e-14: 1e-12 relative, floor 1e-30 rad as above.
      close('periastronAdvancePerOrbit', ob.periastronAdvancePerOrbit, c.periastronAdvancePerOrbit, REL, 1e-30);
      close('nodalAdvancePerOrbit', ob.nodalAdvancePerOrbit, c.nodalAdvancePerOrbit, REL, 1e-30);
      expect(ob.radiallyStable).toBe(c.radiallyStable);
      expect(ob.verticallyStable).toBe(c.verticallyStable);
      expect(ob.stable).toBe(c.radiallyStable && c.verticallyStable);
      expect(ob.bound).toBe(c.bound);
    });
  }
});

describe('circular orbits: the special-case closed forms and identities', () => {
  const radius = fc.double({ min: 1, max: 1e8, noNaN: true });
  const existing = (s: KerrNewman, r: number, d: OrbitDirection): CircularOrbit | null => {
    const o: CircularOrbitResult = circularOrbit(s, r, d);
    return o.exists ? o : null;
  };

  it('Kerr: κ_r² and κ_θ² are the Okazaki, Kato & Fukue (1987, PASJ 39, 457) forms, Ω = ±1/(r^{3/2} ± a)', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 1, noNaN: true }), radius, direction, (a, r, d) => {
        const o = existing({ a, q: 0 }, r, d);
        if (!o) return;
        const s = sgn(d);
        const om = s / (r * Math.sqrt(r) + s * a);
        const om2 = om * om;
        // 1e-12 on the scale of Ω²: both forms cancel near their zeros with a few-ε absolute error.
        expect(Math.abs(o.angularVelocity - om)).toBeLessThanOrEqual(1e-12 * Math.abs(om));
        const kr2 = om2 * (1 - 6 / r + (8 * s * a) / (r * Math.sqrt(r)) - (3 * a * a) / (r * r));
        const kt2 = om2 * (1 - (4 * s * a) / (r * Math.sqrt(r)) + (3 * a * a) / (r * r));
        expect(Math.abs(o.radialEpicyclicFrequencySquared - kr2)).toBeLessThanOrEqual(1e-12 * om2);
        expect(Math.abs(o.verticalEpicyclicFrequencySquared - kt2)).toBeLessThanOrEqual(1e-12 * om2);
      }),
      { numRuns: 500 },
    );
  });

  it('Reissner–Nordström: Ω² = (r − Q²)/r⁴, κ_θ = |Ω|, κ_r² = (r³ − 6r² + 9Q²r − 4Q⁴)/r⁶ (whose zero is the RN ISCO condition)', () => {
    // The κ_r² form is this module's I/(r²(r² ± aσ)²) at a = 0 — derived here, not quoted — written in r
    // instead of through X_r; 1e-12 on the scale of Ω² as above.
    fc.assert(
      fc.property(fc.double({ min: 0, max: 1, noNaN: true }), radius, direction, (q, r, d) => {
        const o = existing({ a: 0, q }, r, d);
        if (!o) return;
        const q2 = q * q;
        const om2 = (r - q2) / r ** 4;
        expect(relErr(o.angularVelocity ** 2, om2)).toBeLessThanOrEqual(1e-12);
        expect(o.verticalEpicyclicFrequency).toBe(Math.abs(o.angularVelocity));
        expect(Math.abs(o.nodalPrecession!)).toBe(0);
        const kr2 = (r * r * (r - 6) + 9 * q2 * r - 4 * q2 * q2) / r ** 6;
        expect(Math.abs(o.radialEpicyclicFrequencySquared - kr2)).toBeLessThanOrEqual(1e-12 * om2);
      }),
      { numRuns: 500 },
    );
  });

  it('agrees with the circular stationary observer of observers.ts (Ω, E, L, clock rate, ZAMO speed)', () => {
    fc.assert(
      fc.property(blackHole, fc.double({ min: 1, max: 1e4, noNaN: true }), direction, (s, r, d) => {
        const o = existing(s, r, d);
        const obs = stationaryObserver(s, { kind: 'circular', r, direction: d });
        expect(o !== null).toBe(obs.exists);
        if (!o || !obs.exists) return;
        expect(o.angularVelocity).toBe(circularOrbitAngularVelocity(s, r, d));
        // The observer forms E, L and its rate from the metric components (its rate from the same product
        // form near the photon orbit): independent roundings of a few ε each, and at most ~4e-15 apart
        // in 1.2e5 random cases; 1e-12 relative as for closed forms.
        expect(relErr(o.energy, obs.energy)).toBeLessThanOrEqual(1e-12);
        expect(relErr(o.angularMomentum, obs.angularMomentum)).toBeLessThanOrEqual(1e-12);
        expect(relErr(o.clockRate, obs.rate)).toBeLessThanOrEqual(1e-12);
        expect(relErr(o.zamoSpeed!, Math.abs(obs.velocityRelativeToZamo!))).toBeLessThanOrEqual(1e-12);
      }),
      { numRuns: 300 },
    );
  });

  it('internal identities: periods, dτ/dt = 1/u^t, γ = 1/√(1 − v²), E − ΩL = dτ/dt (for geodesics)', () => {
    fc.assert(
      fc.property(blackHole, radius, direction, (s, r, d) => {
        const o = existing(s, r, d);
        if (!o) return;
        expect(relErr(o.properPeriod, o.coordinatePeriod * o.clockRate)).toBeLessThanOrEqual(1e-14);
        expect(relErr(o.coordinatePeriod * Math.abs(o.angularVelocity), 2 * Math.PI)).toBeLessThanOrEqual(1e-14);
        // γ comes from its own product form; 1 − v² cancels as v → 1 near the photon orbit, so the
        // identity is checked as 1/γ² = (1 − v)(1 + v) absolutely: v carries a few ε of relative error
        // (its numerator σ(r² + a²) − saμ cancels by up to ~30 close to a near-extremal horizon), and
        // 1 − v² inherits 2v·δv: 2e-14. Both also carry the relative error of Δ, a few ε times
        // ((r − 1)² + |1 − a²| + Q²)/Δ, which near a near-extremal horizon exceeds that.
        const v = o.zamoSpeed!;
        const rm1 = r - 1;
        const delta = rm1 * rm1 - (1 - s.a) * (1 + s.a) + s.q * s.q;
        const deltaTol = (4 * Number.EPSILON * (rm1 * rm1 + Math.abs(1 - s.a * s.a) + s.q * s.q)) / delta;
        expect(Math.abs(1 / o.zamoLorentzFactor! ** 2 - (1 - v) * (1 + v))).toBeLessThanOrEqual(2e-14 + deltaTol);
        // u_μ u^μ = −1 with u^φ = Ω u^t: (−E + ΩL) u^t = −1, so E − ΩL = 1/u^t; E − ΩL cancels
        // mildly (1e-12 relative on the scale of E).
        expect(Math.abs(o.energy - o.angularVelocity * o.angularMomentum - o.clockRate)).toBeLessThanOrEqual(1e-12 * o.energy);
        // 1 − E is formed by whichever of two forms is better conditioned; each side carries a few ε.
        expect(relErr(1 - o.bindingEnergy, o.energy)).toBeLessThanOrEqual(4e-15);
      }),
      { numRuns: 400 },
    );
  });

  it('weak field keeps full precision: 1 − E → 1/(2r) and |Ω| − κ_r → 3 r^{−5/2} at r = 1e12', () => {
    const r = 1e12;
    const o = existing({ a: 0, q: 0 }, r, 'prograde')!;
    // Series: 1 − E = (1/(2r))(1 + O(1/r)); |Ω| − κ_r = |Ω| X/(1 + √(1 − X)) with X = 6/r gives
    // 3r^{−5/2}(1 + O(1/r)). Relative 1e-11 covers O(1/r) = 1e-12 plus rounding; a form that subtracted
    // E from 1 or κ_r from |Ω| directly would be off by ~1e-4 here (ε r).
    expect(relErr(o.bindingEnergy, 1 / (2 * r))).toBeLessThanOrEqual(1e-11);
    expect(relErr(o.periastronPrecession!, 3 / r ** 2.5)).toBeLessThanOrEqual(1e-11);
    expect(relErr(o.periastronAdvancePerOrbit!, (6 * Math.PI) / r)).toBeLessThanOrEqual(1e-11);
  });

  it('null with a reason: invalid input, inside or on the horizon, r ≤ Q², inside the photon orbit', () => {
    const reasonOf = (s: KerrNewman, r: number, d: OrbitDirection = 'prograde') => {
      const o = circularOrbit(s, r, d);
      return o.exists ? 'exists' : o.reason;
    };
    expect(reasonOf({ a: 0, q: 0 }, Number.NaN)).toBe('invalidInput');
    expect(reasonOf({ a: 0, q: 0 }, -1)).toBe('invalidInput');
    expect(reasonOf({ a: 0, q: 0 }, Number.POSITIVE_INFINITY)).toBe('invalidInput');
    expect(reasonOf({ a: Number.NaN, q: 0 }, 10)).toBe('invalidInput');
    expect(reasonOf({ a: 0, q: 0 }, 1.5)).toBe('insideHorizon');
    expect(reasonOf({ a: 0, q: 0 }, 2)).toBe('onHorizon');
    expect(reasonOf({ a: 0, q: 0 }, 2.9)).toBe('insidePhotonOrbit');
    expect(reasonOf({ a: 0, q: 0 }, 3)).toBe('insidePhotonOrbit');
    expect(reasonOf({ a: 0, q: 1.5 }, 2)).toBe('noCircularOrbit');
    expect(reasonOf({ a: 0, q: 1.5 }, 2.25)).toBe('noCircularOrbit');
    expect(reasonOf({ a: 0.9, q: 0 }, 3, 'retrograde')).toBe('insidePhotonOrbit');
    expect(reasonOf({ a: 0.9, q: 0 }, 3, 'prograde')).toBe('exists');
    const o = circularOrbit({ a: 0, q: 0 }, 2.9, 'prograde');
    if (!o.exists) expect(o.message).toMatch(/photon orbit/);
  });

  it('never throws and never returns a non-finite value where it says the orbit exists (else outOfRange or invalidInput)', () => {
    const any = fc.double({ noNaN: false });
    fc.assert(
      fc.property(any, any, any, direction, (a, q, r, d) => {
        const o = circularOrbit({ a, q }, r, d);
        if (!o.exists) return;
        for (const [k, v] of Object.entries(o)) {
          if (typeof v === 'number') expect(Number.isFinite(v), `${k} = ${v}`).toBe(true);
        }
      }),
      { numRuns: 2000 },
    );
  });
});

describe('published values', () => {
  const orbit = (s: KerrNewman, k: CharacteristicOrbitKind, d: OrbitDirection): CharacteristicOrbit =>
    mustExist(characteristicOrbit(s, k, d));

  it('Schwarzschild: ISCO 6M, photon sphere 3M, marginally bound 4M, efficiency 1 − √(8/9) ≈ 5.72% (Bardeen, Press & Teukolsky 1972, ApJ 178, 347)', () => {
    const s = { a: 0, q: 0 };
    expect(orbit(s, 'isco', 'prograde').r).toBe(6);
    expect(orbit(s, 'photonOrbit', 'prograde').r).toBeCloseTo(3, 14);
    expect(orbit(s, 'marginallyBoundOrbit', 'retrograde').r).toBe(4);
    const isco = orbit(s, 'isco', 'prograde');
    expect(isco.bindingEnergy!).toBeCloseTo(1 - Math.sqrt(8 / 9), 15);
    expect(isco.bindingEnergy! * 100).toBeCloseTo(5.72, 2);
    expect(isco.angularMomentum!).toBeCloseTo(2 * Math.sqrt(3), 14); // L_isco = 2√3 M (BPT 1972)
  });

  it('extremal Kerr: prograde ISCO M with efficiency 1 − 1/√3 ≈ 42.3%; retrograde ISCO 9M with ≈ 3.8% (BPT 1972)', () => {
    const pro = orbit({ a: 1, q: 0 }, 'isco', 'prograde');
    expect(pro.r).toBeCloseTo(1, 14);
    expect(pro.bindingEnergy!).toBeCloseTo(1 - 1 / Math.sqrt(3), 14);
    expect(pro.bindingEnergy! * 100).toBeCloseTo(42.3, 1);
    const retro = orbit({ a: 1, q: 0 }, 'isco', 'retrograde');
    expect(retro.r).toBeCloseTo(9, 14);
    expect(retro.bindingEnergy!).toBeCloseTo(1 - Math.sqrt(25 / 27), 15);
    expect(retro.bindingEnergy! * 100).toBeCloseTo(3.8, 1);
  });

  it('spin 0.998 (Thorne 1974, ApJ 191, 507): thin-disc efficiency ≈ 32%', () => {
    const isco = orbit({ a: 0.998, q: 0 }, 'isco', 'prograde');
    expect(isco.bindingEnergy! * 100).toBeCloseTo(32, 0);
    expect(isco.r).toBeCloseTo(1.237, 3); // r_ms(0.998) ≈ 1.24 M (from memory)
  });

  it('extremal Reissner–Nordström ISCO 4M (common practice; r³ − 6r² + 9Q²r − 4Q⁴ = 0 at Q = M)', () => {
    expect(orbit({ a: 0, q: 1 }, 'isco', 'prograde').r).toBeCloseTo(4, 14);
  });

  it('orbital frequency at the ISCO of a 10-solar-mass Schwarzschild hole ≈ 220 Hz (common practice)', () => {
    // GM_sun/c³ = 4.925490947641267e-6 s from the IAU 2015 nominal GM_sun (1e-15: one division).
    const tSun = GM_SUN / C ** 3;
    expect(relErr(tSun, 4.925490947641267e-6)).toBeLessThanOrEqual(1e-15);
    const isco = orbit({ a: 0, q: 0 }, 'isco', 'prograde');
    const f = isco.angularVelocity / (2 * Math.PI) / (10 * tSun);
    expect(f).toBeCloseTo(219.9, 1); // 6^{-3/2}/(2π · 10 GM_sun/c³)
    expect(Math.round(f / 10) * 10).toBe(220);
  });
});
