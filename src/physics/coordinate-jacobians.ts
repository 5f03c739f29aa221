/**
 * Jacobians between the charts of coordinates.ts, the metric components in each chart, and the
 * transformation of vectors and covectors. Geometric units G = c = M = 1.
 *
 * Each chart's Jacobian is taken against the spherical ingoing Kerr chart (t̄, r, θ, φ̄) (the "hub"):
 * Boyer–Lindquist and river differ from it only in t and φ by functions of r (coordinate-integrals.ts
 * gives their derivatives), and Kerr–Schild Cartesian by the oblate-spheroidal map
 * x + i y = (r + i a) sinθ e^{iφ̄}, z = r cosθ, whose inverse Jacobian (determinant Σ sinθ) was derived
 * with sympy in test/fixtures/python/transform.py. The Jacobian between two charts is the product
 * through the hub.
 *
 * Vectors transform with J = ∂x′/∂x (v′ = J v), covectors with its inverse (w′ = w ∂x/∂x′), so that
 * w(v) is unchanged and g′ = (∂x/∂x′)ᵀ g (∂x/∂x′) (Misner, Thorne & Wheeler 1973, §3.2; common practice).
 */
import { deltaFunction, kerrSchildShiftRates, riverShiftRates } from './coordinate-integrals.js';
import { hubToCartesian, type CoordinateSystem, type Vec4 } from './coordinates.js';
import { boyerLindquistMetric, pointFunctions, riverMetric, type KerrNewman } from './spacetime.js';

/** 4×4 matrix, rows then columns. */
export type Mat4 = [Vec4, Vec4, Vec4, Vec4];

const identity = (): Mat4 => [
  [1, 0, 0, 0],
  [0, 1, 0, 0],
  [0, 0, 1, 0],
  [0, 0, 0, 1],
];

/** ∂(chart)/∂(hub) at the hub point h; entries non-finite where it does not exist. */
export function jacobianFromHub(system: CoordinateSystem, s: KerrNewman, h: Vec4): Mat4 {
  const [, r, theta, phib] = h;
  const m = identity();
  if (system === 'boyerLindquist') {
    // t = t̄ − (t̄ − t)(r), φ = φ̄ − (φ̄ − φ)(r).
    const k = kerrSchildShiftRates(s, r);
    m[0][1] = -k.time;
    m[3][1] = -k.azimuth;
  } else if (system === 'river') {
    const k = riverShiftRates(s, r);
    m[0][1] = k.time;
    m[3][1] = k.azimuth;
  } else {
    const sn = Math.sin(theta);
    const cs = Math.cos(theta);
    const cp = Math.cos(phib);
    const sp = Math.sin(phib);
    const a = s.a;
    const xr = r * cp - a * sp; // x/sinθ
    const yr = r * sp + a * cp; // y/sinθ
    m[1] = [0, cp * sn, xr * cs, -yr * sn];
    m[2] = [0, sp * sn, yr * cs, xr * sn];
    m[3] = [0, cs, -r * sn, 0];
  }
  return m;
}

/** ∂(hub)/∂(chart) at the hub point h; for Kerr–Schild Cartesian singular (non-finite) on the axis. */
export function jacobianToHub(system: CoordinateSystem, s: KerrNewman, h: Vec4): Mat4 {
  const [, r, theta, phib] = h;
  const m = identity();
  if (system === 'boyerLindquist') {
    const k = kerrSchildShiftRates(s, r);
    m[0][1] = k.time;
    m[3][1] = k.azimuth;
  } else if (system === 'river') {
    const k = riverShiftRates(s, r);
    m[0][1] = -k.time;
    m[3][1] = -k.azimuth;
  } else {
    // The inverse of the oblate-spheroidal map (derived with sympy in transform.py); det = Σ sinθ.
    const sn = Math.sin(theta);
    const cs = Math.cos(theta);
    const cp = Math.cos(phib);
    const sp = Math.sin(phib);
    const a = s.a;
    const sigma = r * r + a * a * cs * cs;
    const xr = r * cp - a * sp;
    const yr = r * sp + a * cp;
    // θ = π rounds to sinθ ≈ 1.2e-16, not 0: the axis is θ ∈ {0, π} exactly (as cartesianToHub gives it).
    const axis = sn === 0 || theta === 0 || theta === Math.PI || sigma === 0 ? Number.NaN : 1;
    m[1] = [0, (r * xr * sn) / sigma, (r * yr * sn) / sigma, ((r * r + a * a) * cs) / sigma];
    m[2] = [0, (xr * cs) / sigma, (yr * cs) / sigma, (-r * sn) / sigma];
    m[3] = [
      0,
      (-(a * cp * cs * cs + r * sp) / (sigma * sn)) * axis,
      ((r * cp - a * sp * cs * cs) / (sigma * sn)) * axis,
      ((a * cs) / sigma) * axis,
    ];
  }
  return m;
}

export function multiply(p: Mat4, q: Mat4): Mat4 {
  const out = identity();
  for (let i = 0; i < 4; i++) {
    for (let j = 0; j < 4; j++) {
      let sum = 0;
      for (let k = 0; k < 4; k++) sum += p[i]![k]! * q[k]![j]!;
      out[i]![j] = sum;
    }
  }
  return out;
}

export function allFinite(m: Mat4): boolean {
  return m.every((row) => row.every(Number.isFinite));
}

// ---- metrics ---------------------------------------------------------------------------------------

/**
 * Covariant metric components (4×4) in the given chart at the hub point h, from the closed forms:
 * Boyer–Lindquist and river as in spacetime.ts, Kerr–Schild as η + f k ⊗ k with f = μ/Σ. Non-finite
 * entries where the chart does not exist (Boyer–Lindquist on a horizon, river where 2r < Q²).
 */
export function metricAt(system: CoordinateSystem, s: KerrNewman, h: Vec4): Mat4 {
  const [, r, theta] = h;
  const p = pointFunctions(s, r, theta);
  const m: Mat4 = [
    [0, 0, 0, 0],
    [0, 0, 0, 0],
    [0, 0, 0, 0],
    [0, 0, 0, 0],
  ];
  const set = (i: number, j: number, v: number) => {
    m[i]![j] = v;
    m[j]![i] = v;
  };
  if (system === 'boyerLindquist') {
    const g = boyerLindquistMetric(s, { ...p, delta: deltaFunction(s, r) });
    set(0, 0, g.tt);
    set(0, 3, g.tphi);
    set(1, 1, g.rr);
    set(2, 2, g.thth);
    set(3, 3, g.phph);
  } else if (system === 'river') {
    const g = riverMetric(s, p);
    if (!g) return m.map((row) => row.map(() => Number.NaN)) as Mat4;
    set(0, 0, g.TT);
    set(0, 1, g.Tr);
    set(0, 3, g.TPhi);
    set(1, 1, g.rr);
    set(1, 3, g.rPhi);
    set(2, 2, g.thth);
    set(3, 3, g.PhiPhi);
  } else {
    const [, x, y, z] = hubToCartesian(s, h);
    const rho2 = r * r + s.a * s.a;
    const f = p.mu / p.sigma;
    const k = [1, (r * x + s.a * y) / rho2, (r * y - s.a * x) / rho2, Math.cos(theta)];
    const eta = [-1, 1, 1, 1];
    void z;
    for (let i = 0; i < 4; i++) {
      for (let j = i; j < 4; j++) set(i, j, (i === j ? eta[i]! : 0) + f * k[i]! * k[j]!);
    }
  }
  return m;
}

/**
 * ∂(to)/∂(from) and ∂(from)/∂(to) at the hub point h (identity when the charts are the same). Either
 * is null where it does not exist (a horizon for Boyer–Lindquist, 2r < Q² for river, the axis for a
 * map between Cartesian and angular charts).
 */
export function jacobians(
  s: KerrNewman,
  from: CoordinateSystem,
  to: CoordinateSystem,
  h: Vec4,
): { forward: Mat4 | null; inverse: Mat4 | null } {
  if (from === to) return { forward: identity(), inverse: identity() };
  const forward = multiply(jacobianFromHub(to, s, h), jacobianToHub(from, s, h));
  const inverse = multiply(jacobianFromHub(from, s, h), jacobianToHub(to, s, h));
  return { forward: allFinite(forward) ? forward : null, inverse: allFinite(inverse) ? inverse : null };
}

/** v′ = J v (contravariant components). */
export function transformVector(forward: Mat4, v: Vec4): Vec4 {
  return forward.map((row) => row[0] * v[0] + row[1] * v[1] + row[2] * v[2] + row[3] * v[3]) as Vec4;
}

/** w′_ν = w_μ (∂x^μ/∂x′^ν) (covariant components), with inverse = ∂(from)/∂(to). */
export function transformCovector(inverse: Mat4, w: Vec4): Vec4 {
  const [i0, i1, i2, i3] = inverse;
  return [0, 1, 2, 3].map((n) => w[0] * i0[n]! + w[1] * i1[n]! + w[2] * i2[n]! + w[3] * i3[n]!) as Vec4;
}
