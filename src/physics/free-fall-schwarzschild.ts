/**
 * Radial free fall in Schwarzschild (a = Q = 0), inward, in closed form: proper time τ, river time T
 * (the Gullstrand–Painlevé / Doran time, see ./free-fall.ts) and far-away time t between r₁ and r₂,
 * in geometric units G = c = M = 1 (times in GM/c³, radii in GM/c²). freeFall (./free-fall.ts) uses
 * these as fast paths instead of quadrature.
 *
 * - From rest at infinity (E = 1, the river frame): dr/dτ = −√(2/r), so τ = (2/3)(r₁^{3/2} −
 *   r₂^{3/2})/√2 (Misner, Thorne & Wheeler 1973, Gravitation, ch. 31) and T = τ;
 *   t = T − 4u − 2 ln|(u − 1)/(u + 1)|, u = √(r/2).
 * - From rest at r₁ ≥ 2: the cycloid r = (r₁/2)(1 + cos η) (MTW 1973 ch. 31, eq. 31.10; equation
 *   number from memory) gives τ(η) and t(η); T is combined from them into a form regular at r = 2.
 * Each form is rearranged against cancellation and kept accurate close to the horizon (see each
 * function); they are checked against quadrature in test/fixtures/python/proper_time.py and the tests.
 */
import type { FallStart } from './free-fall-types.js';

/**
 * Closed forms for Schwarzschild (a = Q = 0), inward: τ, T, t (t and T may be ignored by the caller).
 * Null where none applies (a launch); NaN for a time that does not exist along the path.
 */
export function schwarzschildClosedForm(
  kind: FallStart['kind'],
  r1: number,
  r2: number,
  energy: number,
): { tau: number; river: number; far: number } | null {
  const u1 = Math.sqrt(r1 / 2);
  const u2 = Math.sqrt(r2 / 2);
  const du = (r1 - r2) / 2 / (u1 + u2); // u₁ − u₂
  if (kind === 'restAtInfinity') {
    const tau = riverFrameProperTime(r1, r2);
    // t = T − h(r), h = 4u + 2 ln|(u − 1)/(u + 1)|: Δt = τ + 4(u₁ − u₂) + 2 ln[(u₁−1)(u₂+1)/((u₁+1)(u₂−1))].
    // u₂ − 1 = (r₂ − 2)/(2(u₂ + 1)) keeps its precision close to the horizon.
    const far = r2 > 2 ? tau + 4 * du + 2 * Math.log1p((4 * du * (u2 + 1)) / ((u1 + 1) * (r2 - 2))) : Number.NaN;
    return { tau, river: tau, far };
  }
  if (kind === 'rest' && energy >= 0) {
    const c = schwarzschildDropFromRest(r1, r2);
    return { tau: c.properTime, river: c.riverTime ?? Number.NaN, far: c.farAwayTime ?? Number.NaN };
  }
  return null;
}

/**
 * Proper time of the river frame (E = 1, falling from rest at infinity) in Schwarzschild from r₁ down
 * to r₂: dr/dτ = −√(2/r), so τ = (2/3)(r₁^{3/2} − r₂^{3/2})/√2 (M = 1; Misner, Thorne & Wheeler
 * 1973, Gravitation, ch. 31, with the start at rest at infinity), evaluated as
 * (√2/3)(r₁ − r₂)(r₁ + √(r₁r₂) + r₂)/(√r₁ + √r₂) to avoid cancellation. From the horizon to r = 0: 4/3.
 */
export function riverFrameProperTime(r1: number, r2: number): number {
  const s1 = Math.sqrt(r1);
  const s2 = Math.sqrt(r2);
  return ((Math.SQRT2 / 3) * (r1 - r2) * (r1 + s1 * s2 + r2)) / (s1 + s2);
}

/**
 * Schwarzschild fall from rest at r₁ ≥ 2 to r₂ ∈ [0, r₁] (Misner, Thorne & Wheeler 1973, Gravitation,
 * ch. 31, eq. 31.10, the cycloid; equation number from memory): r = (r₁/2)(1 + cos η), so tan(η/2) = √((r₁ − r)/r) and
 *   τ = √(r₁³/8) (η + sin η),
 *   t = 2 ln|(k + tan(η/2))/(k − tan(η/2))| + 2k[η + (r₁/4)(η + sin η)],   k = √(r₁/2 − 1),
 * with the logarithm evaluated as 4 artanh(tan(η/2)/k) (t exists only while r₂ > 2), and the river time
 * T = t + 4u + 2 ln|(u − 1)/(u + 1)| (u = √(r/2)) combined into a form regular at r = 2:
 *   ΔT = 4(u₂ − u₁) + 2k[η + (r₁/4)(η + sin η)] + 2 ln(r₂/r₁) + 4 ln(1 + tan(η/2)/k) + 4 ln((u₁+1)/(u₂+1)).
 * The t and T forms are from MTW's t(η) (recalled from memory) and checked against quadrature in the
 * fixture and tests. From r₁ = 2 (E = 0) to 0: τ = π, the longest proper time inside (MTW 1973 ch. 31);
 * t and T are null there (E = 0).
 */
export function schwarzschildDropFromRest(
  r1: number,
  r2: number,
): { properTime: number; farAwayTime: number | null; riverTime: number | null } {
  const tanHalf = Math.sqrt((r1 - r2) / r2); // ∞ at r₂ = 0
  const eta = 2 * Math.atan(tanHalf);
  const sinEta = (2 * tanHalf) / (1 + tanHalf * tanHalf); // sin η = 2 tan(η/2)/(1 + tan²(η/2))
  const sinEtaSafe = Number.isFinite(sinEta) ? sinEta : 0;
  const tau = Math.sqrt((r1 * r1 * r1) / 8) * (eta + sinEtaSafe);
  if (!(r1 > 2)) return { properTime: tau, farAwayTime: null, riverTime: null };
  const k = Math.sqrt((r1 - 2) / 2);
  const cyc = 2 * k * (eta + (r1 / 4) * (eta + sinEtaSafe));
  // 2 ln((k + tan)/(k − tan)) = 4 artanh(tan/k); near the horizon tan/k → 1 and k − tan is formed
  // exactly as r₁(r₂ − 2)/(2r₂(k + tan)), so the logarithm is 2 ln(2r₂(k + tan)²/(r₁(r₂ − 2))).
  const z = tanHalf / k;
  const far =
    r2 > 2
      ? (z < 0.5 ? 4 * Math.atanh(z) : 2 * Math.log((2 * r2 * (k + tanHalf) * (k + tanHalf)) / (r1 * (r2 - 2)))) + cyc
      : null;
  const u1 = Math.sqrt(r1 / 2);
  const u2 = Math.sqrt(r2 / 2);
  const du = (r1 - r2) / 2 / (u1 + u2);
  // 2 ln(r₂/r₁) + 4 ln(1 + tan(η/2)/k) = 4 ln[(√r₂ + √(r₁ − r₂)/k)/√r₁], used near r₂ = 0 where the two
  // terms are large and opposite; the log1p forms near r₁ where both are small.
  const logs =
    r2 < r1 / 4
      ? 4 * Math.log((Math.sqrt(r2) + Math.sqrt(r1 - r2) / k) / Math.sqrt(r1))
      : 2 * Math.log1p((r2 - r1) / r1) + 4 * Math.log1p(tanHalf / k);
  const river = -4 * du + cyc + logs + 4 * Math.log1p(du / (u2 + 1));
  return { properTime: tau, farAwayTime: far, riverTime: river };
}
