/**
 * Geodesics: radial plunges against the free-fall proper and river times (src/physics/free-fall.ts,
 * closed forms and quadrature), light at the photon orbit, escape, horizon events, the observers'
 * tetrads, refusals and the bounds on samples and steps.
 */
import { describe, expect, it } from 'vitest';
import { freeFall } from '../../src/physics/free-fall.js';
import { geodesic, innerStopRadius, type Geodesic, type GeodesicRequest } from '../../src/physics/geodesic.js';
import { hubToCartesian } from '../../src/physics/coordinates.js';
import { geodesicRhs } from '../../src/physics/geodesic-equations.js';
import { kerrIsco } from '../../src/physics/characteristic-orbits.js';
import { circularOrbit } from '../../src/physics/orbits.js';
import { horizons, type KerrNewman } from '../../src/physics/spacetime.js';
import { ingoingInverseMetric, ingoingMetric, launchMomentum, observerTetrad } from '../../src/physics/tetrads.js';

function ok(s: KerrNewman, req: GeodesicRequest): Geodesic {
  const g = geodesic(s, req);
  if (!g.ok) throw new Error(g.message);
  return g;
}

const launch = (observer: 'static' | 'zamo' | 'river', r: number, theta: number, speed: number, psi: number, chi = 0) =>
  ({ kind: 'observer', observer, r, theta, phi: 0, speed, psi, chi }) as const;

describe('radial plunges reproduce the free-fall clocks', () => {
  const cases: { name: string; s: KerrNewman; observer: 'static' | 'zamo' | 'river'; start: 'rest' | 'restAtInfinity' }[] = [
    { name: 'Schwarzschild, from rest at r = 10 (cycloid, closed form)', s: { a: 0, q: 0 }, observer: 'static', start: 'rest' },
    { name: 'Kerr a = 0.9, equator, from rest relative to the ZAMO at r = 10', s: { a: 0.9, q: 0 }, observer: 'zamo', start: 'rest' },
    { name: 'Kerr a = 0.9, equator, the river free-faller (E = 1, L = 0)', s: { a: 0.9, q: 0 }, observer: 'river', start: 'restAtInfinity' },
    { name: 'Reissner–Nordström Q = 0.6, from rest at r = 10', s: { a: 0, q: 0.6 }, observer: 'static', start: 'rest' },
  ];
  for (const c of cases) {
    it(c.name, () => {
      const rPlus = horizons(c.s)!.outer;
      const g = ok(c.s, { particle: 'timelike', start: launch(c.observer, 10, Math.PI / 2, 0, 0), maxLength: 500, samples: 11, rtol: 1e-12 });
      const ev = g.events.find((e) => e.kind === 'outerHorizon');
      expect(ev).toBeDefined();
      const ff = freeFall(c.s, { r1: 10, r2: rPlus, theta: Math.PI / 2, start: { kind: c.start } });
      if (!ff.ok) throw new Error(ff.message);
      // freeFall: closed form or quadrature at 1e−12; ours: DOP853 at rtol 1e−12 with the event on the
      // dense output. 1e−10 relative leaves room for both.
      expect(Math.abs(ev!.lambda - ff.properTime) / ff.properTime).toBeLessThan(1e-10);
      expect(Math.abs(ev!.river - ff.riverTime!) / ff.riverTime!).toBeLessThan(1e-10);
      // It keeps going inside, to the inner horizon (stopped just above it), or to the singularity.
      expect(g.termination).toBe(c.s.a === 0 && c.s.q === 0 ? 'singularity' : 'innerHorizon');
      // Boyer–Lindquist t is finite before the crossing and null after it.
      const k = g.samples.count - 1;
      expect(Number.isNaN(g.samples.t[k]!)).toBe(true);
      expect(Number.isFinite(g.samples.t[1]!) || g.samples.r[1]! <= rPlus).toBe(true);
    });
  }

  it('a fall to the inner horizon matches the free-fall proper time there (Reissner–Nordström)', () => {
    const s = { a: 0, q: 0.6 };
    const g = ok(s, { particle: 'timelike', start: launch('static', 10, 1.0, 0, 0), maxLength: 500, samples: 3, rtol: 1e-12 });
    const ev = g.events.find((e) => e.kind === 'innerHorizon')!;
    const ff = freeFall(s, { r1: 10, r2: innerStopRadius(s), theta: 1.0, start: { kind: 'rest' } });
    if (!ff.ok) throw new Error(ff.message);
    expect(Math.abs(ev.lambda - ff.properTime) / ff.properTime).toBeLessThan(1e-9);
    expect(Math.abs(ev.river - ff.riverTime!) / ff.riverTime!).toBeLessThan(1e-9);
  });
});

describe('a plunge from the ISCO', () => {
  it('with the ISCO circular orbit\'s E and L, just inside the ISCO, a body spirals in through the horizon (Kerr a = 0.9, prograde)', () => {
    const s = { a: 0.9, q: 0 };
    const rIsco = kerrIsco(0.9, 'prograde');
    const orbit = circularOrbit(s, rIsco, 'prograde');
    if (!('energy' in orbit)) throw new Error('no circular orbit at the ISCO');
    // R(r) has a triple root at the ISCO and is positive just inside it: the plunge starts slowly.
    const g = ok(s, {
      particle: 'timelike',
      start: { kind: 'constants', r: rIsco - 1e-3, theta: Math.PI / 2, phi: 0, E: orbit.energy, L: orbit.angularMomentum, carter: 0, radialSign: -1, polarSign: 1 },
      maxLength: 5000,
      samples: 101,
      rtol: 1e-12,
    });
    const cross = g.events.find((e) => e.kind === 'outerHorizon');
    expect(cross).toBeDefined();
    expect(g.termination).toBe('innerHorizon');
    // It winds round several times on the way in (the slow start near the triple root).
    expect(cross!.phi).toBeGreaterThan(2 * Math.PI);
    expect(g.events.some((e) => e.kind === 'radialTurningPoint')).toBe(false);
    expect(Math.abs(g.end.carter)).toBeLessThan(1e-20);
  });
});

describe('light', () => {
  it('stays on the Schwarzschild photon orbit r = 3 when launched tangentially there', () => {
    const g = ok({ a: 0, q: 0 }, { particle: 'null', start: launch('static', 3, Math.PI / 2, 0, Math.PI / 2), maxLength: 20, samples: 21, rtol: 1e-12 });
    for (let k = 0; k < g.samples.count; k++) expect(Math.abs(g.samples.r[k]! - 3)).toBeLessThan(1e-8);
    // b = L/E = 3√3 (MTW 1973 eq. 25.58): the critical impact parameter.
    expect(g.constants.L / g.constants.E).toBeCloseTo(3 * Math.sqrt(3), 12);
    expect(g.end.twiceH).toBeCloseTo(0, 12);
  });

  it('escapes or is captured either side of the critical impact parameter', () => {
    const s = { a: 0, q: 0 };
    const run = (b: number) =>
      ok(s, {
        particle: 'null',
        start: { kind: 'constants', r: 500, theta: Math.PI / 2, phi: 0, E: 1, L: b, carter: 0, radialSign: -1, polarSign: 1 },
        maxLength: 20000,
        samples: 2,
        rtol: 1e-12,
        escapeRadius: 1000,
      });
    const outside = run(3 * Math.sqrt(3) * (1 + 1e-6));
    const inside = run(3 * Math.sqrt(3) * (1 - 1e-6));
    expect(outside.termination).toBe('escape');
    expect(inside.termination).toBe('singularity');
    expect(inside.events.some((e) => e.kind === 'outerHorizon')).toBe(true);
    // Near-critical light winds round the photon orbit before it leaves: one radial turning point near r = 3.
    const turn = outside.events.filter((e) => e.kind === 'radialTurningPoint');
    expect(turn.length).toBe(1);
    expect(Math.abs(turn[0]!.r - 3)).toBeLessThan(0.01);
  });

  it('radially outgoing light escapes and its clocks stay consistent with Boyer–Lindquist t', () => {
    const s = { a: 0, q: 0 };
    const g = ok(s, { particle: 'null', start: launch('static', 10, Math.PI / 2, 0, 0), maxLength: 2000, samples: 101, escapeRadius: 100 });
    expect(g.termination).toBe('escape');
    const k = g.samples.count - 1;
    expect(g.samples.r[k]).toBeCloseTo(100, 9);
    // Outgoing radial light: t = r* + const with the Schwarzschild tortoise coordinate
    // r* = r + 2M ln(r/2M − 1) (Misner, Thorne & Wheeler 1973, §25.5), so Δt = r*(100) − r*(10).
    const tortoise = (r: number) => r + 2 * Math.log(r / 2 - 1);
    const expected = tortoise(100) - tortoise(10);
    expect(Math.abs(g.samples.t[k]! - expected) / expected).toBeLessThan(1e-9);
  });
});

describe('the ingoing Kerr–Newman metric and the observers', () => {
  it('g_{μν} g^{νλ} = δ_μ^λ inside and outside the horizons', () => {
    for (const [a, q, r, th] of [
      [0.9, 0, 10, 1],
      [0.9, 0, 1.2, 0.3],
      [0.6, 0.5, 0.5, 2.0],
      [0, 0, 1, 1.5],
    ] as const) {
      const g = ingoingMetric({ a, q }, r, th);
      const h = ingoingInverseMetric({ a, q }, r, th);
      for (let i = 0; i < 4; i++) {
        for (let j = 0; j < 4; j++) {
          let sum = 0;
          for (let k = 0; k < 4; k++) sum += g[i * 4 + k]! * h[k * 4 + j]!;
          expect(Math.abs(sum - (i === j ? 1 : 0))).toBeLessThan(1e-13);
        }
      }
    }
  });

  it('each tetrad is orthonormal; the river frame exists inside the horizon, static observers and ZAMOs inside the inner one', () => {
    // r+ = 1 + √0.15 ≈ 1.387, r− ≈ 0.613. At r = 0.3, θ = 0.3: Δ = 0.34 > 0, Σ ≈ 0.829 > μ = 0.56, A > 0.
    const s = { a: 0.9, q: 0.2 };
    for (const [obs, r, th] of [
      ['static', 8, 1.1],
      ['zamo', 2, 1.1],
      ['river', 8, 1.1],
      ['river', 1.2, 1.1],
      ['river', 0.3, 1.1],
      ['static', 0.3, 0.3],
      ['zamo', 0.3, 0.3],
      ['zamo', 0.3, 1.1],
    ] as const) {
      const t = observerTetrad(s, obs, r, th);
      if (!t.ok) throw new Error(`${obs} at ${r}: ${t.reason}`);
      const { e, g } = t.tetrad;
      for (let i = 0; i < 4; i++) {
        for (let j = 0; j < 4; j++) {
          let dot = 0;
          for (let m = 0; m < 4; m++) for (let n = 0; n < 4; n++) dot += g[m * 4 + n]! * e[i]![m]! * e[j]![n]!;
          const eta = i !== j ? 0 : i === 0 ? -1 : 1;
          expect(Math.abs(dot - eta), `${obs} r=${r} e${i}·e${j}`).toBeLessThan(1e-12);
        }
      }
    }
    expect(observerTetrad(s, 'static', 1.9, Math.PI / 2)).toEqual({ ok: false, reason: 'ergoregion' });
    expect(observerTetrad(s, 'zamo', 1.2, 1.1)).toEqual({ ok: false, reason: 'betweenHorizons' });
    expect(observerTetrad(s, 'static', 1.2, 0.3)).toEqual({ ok: false, reason: 'betweenHorizons' });
    // Inside the inner horizon, near the equator: the inner sheet of the ergoregion (Σ ≈ 0.257 < μ = 0.56).
    expect(observerTetrad(s, 'static', 0.3, 1.1)).toEqual({ ok: false, reason: 'ergoregion' });
    expect(observerTetrad(s, 'static', 1 + Math.sqrt(0.15), 0.3)).toEqual({ ok: false, reason: 'onHorizon' });
    expect(observerTetrad({ a: 0.3, q: 0.9 }, 'river', 0.2, 1.1)).toEqual({ ok: false, reason: 'noRiver' });
    expect(observerTetrad(s, 'zamo', 10, 0)).toEqual({ ok: false, reason: 'onAxis' });
  });

  it('a launch with speed w measured by the ZAMO has energy γ(α + ωL)… i.e. −p·u = γ', () => {
    const s = { a: 0.9, q: 0 };
    const t = observerTetrad(s, 'zamo', 10, Math.PI / 2);
    if (!t.ok) throw new Error(t.reason);
    const w = 0.3;
    const p = launchMomentum(t.tetrad, 'timelike', w, Math.PI / 6, 0);
    const u = t.tetrad.e[0];
    const pu = p.reduce((acc, pi, i) => acc + pi * u[i]!, 0);
    expect(-pu).toBeCloseTo(1 / Math.sqrt(1 - w * w), 13);
  });

  it('the right-hand side is finite across the outer horizon (no coordinate singularity)', () => {
    const s = { a: 0.9, q: 0 };
    const rPlus = horizons(s)!.outer;
    const d = new Float64Array(7);
    geodesicRhs(s, { E: 0.95, L: 1, kappa: 1 }, Float64Array.from([rPlus, 1.2, 0.7, 0.1, 0, 0, 0]), d);
    for (const x of d) expect(Number.isFinite(x)).toBe(true);
  });

  it('Kerr–Schild Cartesian coordinates: the ring singularity at r = 0, θ = π/2 has radius a', () => {
    const [, x, y, z] = hubToCartesian({ a: 0.7, q: 0 }, [0, 0, Math.PI / 2, 1.3]);
    expect(Math.hypot(x, y)).toBeCloseTo(0.7, 14);
    expect(z).toBeCloseTo(0, 14);
  });
});

describe('turning points', () => {
  it('polar turning points of an inclined orbit lie where p_θ² = K − cos²θ(a²(1 − E²) + L²/sin²θ) = 0; equatorial orbits have none', () => {
    const s = { a: 0.9, q: 0 };
    const start = { kind: 'constants' as const, r: 12, theta: Math.PI / 2, phi: 0, E: 0.97, L: 3, carter: 4, radialSign: 1 as const, polarSign: 1 as const };
    const g = ok(s, { particle: 'timelike', start, maxLength: 2000, samples: 2, rtol: 1e-12 });
    const polar = g.events.filter((e) => e.kind === 'polarTurningPoint');
    expect(polar.length).toBeGreaterThan(2);
    for (const e of polar) {
      const c2 = Math.cos(e.theta) ** 2;
      const theta2 = 4 - c2 * (0.81 * (1 - 0.97 ** 2) + 9 / (1 - c2));
      // Located on the dense output to ~1e−13 in λ; Θ has a simple zero there.
      expect(Math.abs(theta2)).toBeLessThan(1e-9);
    }
    const flat = ok(s, { particle: 'timelike', start: { ...start, carter: 0 }, maxLength: 2000, samples: 2 });
    expect(flat.events.some((e) => e.kind === 'polarTurningPoint')).toBe(false);
    expect(flat.events.some((e) => e.kind === 'radialTurningPoint')).toBe(true);
  });

  it('a start exactly on a body\'s surface, moving inward, ends there at once', () => {
    const g = ok({ a: 0, q: 0 }, { particle: 'timelike', start: launch('static', 6, Math.PI / 2, 0.1, Math.PI), maxLength: 100, samples: 3, surfaceRadius: 6 });
    expect(g.termination).toBe('surface');
    expect(g.length).toBe(0);
  });
});

describe('refusals, limits and statuses', () => {
  const s = { a: 0.9, q: 0 };
  const base = { particle: 'timelike' as const, maxLength: 100, samples: 11 };
  it('refuses speeds ≥ c, absent observers and forbidden constants', () => {
    expect(geodesic(s, { ...base, start: launch('zamo', 10, 1, 1, 0) })).toMatchObject({ ok: false, reason: 'speed' });
    expect(geodesic(s, { ...base, start: launch('static', 1.9, Math.PI / 2, 0, 0) })).toMatchObject({ ok: false, reason: 'noObserver' });
    expect(geodesic(s, { ...base, start: launch('zamo', 10, 0, 0.1, 0) })).toMatchObject({ ok: false, reason: 'singularStart' });
    const forbidden = { kind: 'constants' as const, r: 10, theta: 1, phi: 0, E: 0.5, L: 3, carter: 1, radialSign: 1 as const, polarSign: 1 as const };
    expect(geodesic(s, { ...base, start: forbidden })).toMatchObject({ ok: false, reason: 'forbiddenStart' });
    expect(geodesic(s, { ...base, start: launch('zamo', 10, 1, 0, 0), escapeRadius: 5 })).toMatchObject({ ok: false, reason: 'beyondEscape' });
  });

  it('keeps at most samples + 1 samples and stops at maxSteps with that status', () => {
    const g = ok(s, { ...base, start: launch('zamo', 10, Math.PI / 2, 0.35, Math.PI / 2), maxLength: 5000, samples: 7 });
    expect(g.samples.count).toBeLessThanOrEqual(8);
    expect(g.termination).toBe('maxLength');
    expect(g.samples.lambda[g.samples.count - 1]).toBe(5000);
    const short = ok(s, { ...base, start: launch('zamo', 10, Math.PI / 2, 0.35, Math.PI / 2), maxLength: 5000, samples: 7, maxSteps: 20 });
    expect(short.termination).toBe('maxSteps');
    expect(short.steps.accepted).toBe(20);
    expect(short.length).toBeLessThan(5000);
  });

  it('stops at the outer horizon on request', () => {
    const g = ok(s, { ...base, start: launch('river', 10, 1.2, 0, 0), stopAt: 'outerHorizon' });
    expect(g.termination).toBe('outerHorizon');
    expect(g.end.r).toBeCloseTo(horizons(s)!.outer, 12);
  });

  it('river time stays defined down to the inner horizon (2r₋ − Q² = r₋² + a² ≥ 0) and is null from the start where 2r < Q²', () => {
    const q = { a: 0.3, q: 0.9 };
    const g = ok(q, { ...base, start: launch('river', 5, Math.PI / 2, 0.5, Math.PI), maxLength: 50, samples: 51 });
    expect(g.riverLostAt).toBeNull();
    for (let k = 0; k < g.samples.count; k++) expect(Number.isFinite(g.samples.river[k]!)).toBe(true);
    // A charged body with a surface at r = 1.5 < Q²/2 = 2: no river time anywhere near it.
    const body = ok({ a: 0, q: 2 }, { ...base, start: launch('static', 1.6, Math.PI / 2, 0.1, 0), surfaceRadius: 1.5 });
    expect(body.riverLostAt).toBe(0);
    expect(Number.isNaN(body.samples.river[0]!)).toBe(true);
    expect(g.termination).toBe('innerHorizon');
  });
});

describe('samples over the path actually travelled', () => {
  it('a plunge that ends at the horizon early gets its samples evenly over [0, λ_end], the same path as one pass', () => {
    const s = { a: 0.9, q: 0 };
    const req = { particle: 'timelike' as const, start: launch('zamo', 10, Math.PI / 2, 0.3, (150 * Math.PI) / 180), maxLength: 2000, samples: 50, stopAt: 'outerHorizon' as const };
    const g = ok(s, req);
    const one = ok(s, { ...req, sampleOver: 'maxLength' });
    expect(g.termination).toBe('outerHorizon');
    expect(g.length).toBeLessThan(100);
    expect(one.samples.count).toBeLessThan(10);
    expect(g.samples.count).toBeGreaterThanOrEqual(50);
    expect(g.samples.count).toBeLessThanOrEqual(51);
    const n = g.samples.count;
    expect(g.samples.lambda[n - 1]).toBe(g.length);
    // Even spacing, and the second pass ends where the first did (same steps; only the last is clipped).
    const spacing = g.length / 49;
    for (let k = 1; k < 49; k++) expect(g.samples.lambda[k]! - g.samples.lambda[k - 1]!).toBeCloseTo(spacing, 9);
    expect(Math.abs(g.samples.r[n - 1]! - one.samples.r[one.samples.count - 1]!)).toBeLessThan(1e-9);
    expect(Math.abs(g.samples.v[n - 1]! - one.samples.v[one.samples.count - 1]!)).toBeLessThan(1e-9);
    // Everything else comes from the first pass.
    expect(g.events).toEqual(one.events);
    expect(g.steps).toEqual(one.steps);
  });
});
