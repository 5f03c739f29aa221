/**
 * Tanh-sinh (double-exponential) quadrature on a finite interval, for integrands that are smooth
 * inside the interval but may have integrable singularities at its ends (1/√(r₁ − r) at a turning
 * point, √r at r = 0).
 *
 * Method (Takahasi & Mori 1974, "Double exponential formulas for numerical integration", Publ. RIMS
 * Kyoto Univ. 9, 721–741; Bailey, Jeyabalan & Li 2005, "A comparison of three high-precision
 * quadrature schemes", Experimental Mathematics 14, 317–329): with the change of variable
 *   x = m + h_w tanh(s(t)),  s(t) = (π/2) sinh t,  m = (a + b)/2,  h_w = (b − a)/2,
 * the integral becomes ∫_{−∞}^{∞} f(x(t)) h_w w(t) dt with w(t) = (π/2) cosh t / cosh² s(t), which
 * decays double-exponentially, so the trapezoidal rule with step h converges roughly like
 * exp(−c/h) even when f has algebraic singularities at a or b. Level k uses h = 2^−k; each level
 * reuses every node of the previous one and adds the odd multiples of h, so S_k = S_{k−1}/2 + h Σ_new.
 *
 * Error estimate: |S_k − S_{k−1}|, the change made by the last halving. Because the error of the
 * trapezoidal sums falls roughly quadratically from level to level (each halving about doubles the
 * number of correct digits), this over-estimates the error of S_k; it is what the convergence test
 * uses (relative, with an optional absolute floor), so "converged" is a conservative statement.
 *
 * Endpoint accuracy: near an end, x itself cannot resolve the distance to it (b − x rounds to 0 long
 * before the weights become negligible), so the integrand receives the distances to both ends,
 * computed directly from 1 ∓ tanh s = 2/(1 + e^{±2s}) with full relative precision. Integrands with a
 * singular factor at an end must use those distances, not x, for it.
 *
 * Cost: the nodes and weights of each level are computed once per process (lazily) and shared; an
 * integration allocates a few small arrays, and nothing per evaluation. The sums stop early in each
 * tail once a term falls below 1e−20 of the running sum of magnitudes (past t ≈ 1.3, where the terms
 * decrease double-exponentially).
 */

/** f(x, x − a, b − x): the integrand with the distances to both ends, each with full precision. */
export type Integrand = (x: number, toLower: number, toUpper: number) => number;

/**
 * A vector-valued integrand sharing nodes: writes its m components into `out` (length m). Used when
 * several integrals share expensive common factors (proper, river and far-away time of one path).
 */
export type VectorIntegrand = (x: number, toLower: number, toUpper: number, out: Float64Array) => void;

export interface QuadratureOptions {
  /** Stop when |S_k − S_{k−1}| ≤ relativeTolerance · |S_k| (default 1e−12). */
  relativeTolerance?: number;
  /** ... or when |S_k − S_{k−1}| ≤ absoluteTolerance (default 0). */
  absoluteTolerance?: number;
  /** Vector form only: per-component absolute tolerances (overriding absoluteTolerance where given). */
  absoluteTolerances?: ArrayLike<number>;
  /** Highest level (step 2^−maxLevel); default 12, at most 16. */
  maxLevel?: number;
  /** Lowest level at which convergence may be declared (guards against chance agreement); default 3. */
  minLevel?: number;
}

export interface QuadratureResult {
  value: number;
  /** |S_k − S_{k−1}| at the last level (conservative; see the module comment). */
  errorEstimate: number;
  /** Number of integrand evaluations. */
  evaluations: number;
  /** Whether the tolerance was met by maxLevel (false also when the integrand was not finite). */
  converged: boolean;
  /** The last level computed (step 2^−level). */
  level: number;
}

export interface VectorQuadratureResult {
  values: Float64Array;
  errorEstimates: Float64Array;
  /** Per component: whether its own tolerance was met. */
  convergedEach: boolean[];
  evaluations: number;
  converged: boolean;
  level: number;
}

const HALF_PI = Math.PI / 2;
/** Nodes are kept while 1 − tanh s ≥ this: past it the weights are below ~1e−300. */
const MIN_COMPLEMENT = 1e-300;
/** A tail stops once a term is below this fraction of the running sum of magnitudes. */
const TAIL_CUTOFF = 1e-20;
/** A non-finite value this close to an end (1 − tanh s below it) ends that tail instead of failing. */
const FAR_TAIL_COMPLEMENT = 1e-100;
const MAX_LEVEL_LIMIT = 16;

/** Nodes of one level for t > 0 (mirrored for t < 0): 1 − tanh s(t) and the weight w(t). */
interface Level {
  complement: Float64Array;
  weight: Float64Array;
}

const levels: Level[] = [];

/** Level k: t = j 2^−k for j odd (k ≥ 1) or j = 1, 2, ... (k = 0), while 1 − tanh s ≥ MIN_COMPLEMENT. */
function level(k: number): Level {
  const cached = levels[k];
  if (cached) return cached;
  const h = 2 ** -k;
  const step = k === 0 ? 1 : 2;
  const c: number[] = [];
  const w: number[] = [];
  for (let j = 1; ; j += step) {
    const t = j * h;
    const s = HALF_PI * Math.sinh(t);
    const e = Math.exp(-2 * s); // e^{−2s}
    const complement = (2 * e) / (1 + e); // 1 − tanh s = 2/(1 + e^{2s})
    if (complement < MIN_COMPLEMENT) break;
    // w = (π/2) cosh t / cosh² s = (π/2) cosh t · 4e^{−2s}/(1 + e^{−2s})², overflow-free.
    w.push((HALF_PI * Math.cosh(t) * 4 * e) / ((1 + e) * (1 + e)));
    c.push(complement);
  }
  const built = { complement: Float64Array.from(c), weight: Float64Array.from(w) };
  levels[k] = built;
  return built;
}

/**
 * ∫_a^b f(x) dx by tanh-sinh quadrature with level doubling (see the module comment). f receives
 * (x, x − a, b − x). Returns the value, the error estimate |S_k − S_{k−1}|, the number of
 * evaluations and whether the tolerance was met. a > b gives −∫_b^a; a = b gives 0. Non-finite a or b,
 * or a non-finite integrand value away from the extreme tails, gives value NaN and converged false.
 */
export function tanhSinh(f: Integrand, a: number, b: number, options: QuadratureOptions = {}): QuadratureResult {
  const r = tanhSinhVector(
    (x, lo, up, o) => {
      o[0] = f(x, lo, up);
    },
    a,
    b,
    1,
    options,
  );
  return {
    value: r.values[0] ?? Number.NaN,
    errorEstimate: r.errorEstimates[0] ?? Number.NaN,
    evaluations: r.evaluations,
    converged: r.converged,
    level: r.level,
  };
}

/**
 * The vector form of {@link tanhSinh}: m integrals over the same interval with shared nodes. Level
 * doubling continues until every component meets the tolerance (or maxLevel); each component's own
 * error estimate and convergence are reported.
 */
export function tanhSinhVector(
  f: VectorIntegrand,
  a: number,
  b: number,
  m: number,
  options: QuadratureOptions = {},
): VectorQuadratureResult {
  const rtol = options.relativeTolerance ?? 1e-12;
  const atol = options.absoluteTolerance ?? 0;
  const maxLevel = Math.min(Math.max(Math.floor(options.maxLevel ?? 12), 0), MAX_LEVEL_LIMIT);
  const minLevel = Math.min(Math.max(Math.floor(options.minLevel ?? 3), 0), maxLevel);
  const values = new Float64Array(m);
  const errors = new Float64Array(m);
  const fail = (): VectorQuadratureResult => ({
    values: values.fill(Number.NaN),
    errorEstimates: errors.fill(Number.NaN),
    convergedEach: Array.from({ length: m }, () => false),
    evaluations,
    converged: false,
    level: 0,
  });
  let evaluations = 0;
  if (!Number.isFinite(a) || !Number.isFinite(b)) return fail();
  if (a === b) {
    return { values, errorEstimates: errors, convergedEach: Array.from({ length: m }, () => true), evaluations, converged: true, level: 0 };
  }
  const sign = a < b ? 1 : -1;
  const lo = Math.min(a, b);
  const hi = Math.max(a, b);
  const half = (hi - lo) / 2;
  const mid = lo + half;

  const out = new Float64Array(m);
  const sum = new Float64Array(m); // running Σ w f over all nodes so far (unscaled by h)
  const absSum = new Float64Array(m); // running Σ |w f|
  const prev = new Float64Array(m);

  // Centre node (t = 0): x = mid, weight π/2.
  f(mid, half, half, out);
  evaluations++;
  for (let i = 0; i < m; i++) {
    const term = HALF_PI * (out[i] as number);
    if (!Number.isFinite(term)) return fail();
    sum[i] = term;
    absSum[i] = Math.abs(term);
  }

  /** Adds one tail (side = +1: towards hi, −1: towards lo) of level k; false if a value was not finite. */
  const addTail = (lv: Level, side: 1 | -1): boolean => {
    const { complement, weight } = lv;
    for (let j = 0; j < complement.length; j++) {
      const c = complement[j] as number;
      const near = half * c; // distance to the near end
      const far = half * (2 - c); // distance to the far end
      let x: number;
      if (side > 0) {
        x = hi - near;
        f(x, far, near, out);
      } else {
        x = lo + near;
        f(x, near, far, out);
      }
      evaluations++;
      const w = weight[j] as number;
      let tiny = true;
      let finite = true;
      for (let i = 0; i < m; i++) {
        const term = w * (out[i] as number);
        if (!Number.isFinite(term)) {
          finite = false;
          break;
        }
        if (Math.abs(term) > TAIL_CUTOFF * (absSum[i] as number)) tiny = false;
      }
      if (!finite) {
        if (c < FAR_TAIL_COMPLEMENT) return true; // the remaining weights are negligible
        return false;
      }
      for (let i = 0; i < m; i++) {
        const term = w * (out[i] as number);
        sum[i] = (sum[i] as number) + term;
        absSum[i] = (absSum[i] as number) + Math.abs(term);
      }
      if (tiny && c < 0.01) return true;
    }
    return true;
  };

  const convergedEach = Array.from({ length: m }, () => false);
  let k = 0;
  for (; k <= maxLevel; k++) {
    const lv = level(k);
    if (!addTail(lv, 1) || !addTail(lv, -1)) return fail();
    const h = 2 ** -k;
    let all = true;
    for (let i = 0; i < m; i++) {
      const value = (sum[i] as number) * h * half;
      const err = k === 0 ? Number.POSITIVE_INFINITY : Math.abs(value - (prev[i] as number));
      values[i] = value;
      errors[i] = err;
      const atolI = options.absoluteTolerances?.[i] ?? atol;
      const ok = k >= minLevel && (err <= rtol * Math.abs(value) || err <= atolI);
      convergedEach[i] = ok;
      if (!ok) all = false;
      prev[i] = value;
    }
    if (all) break;
  }
  const last = Math.min(k, maxLevel);
  for (let i = 0; i < m; i++) values[i] = sign * (values[i] as number);
  return {
    values,
    errorEstimates: errors,
    convergedEach,
    evaluations,
    converged: convergedEach.every(Boolean),
    level: last,
  };
}
