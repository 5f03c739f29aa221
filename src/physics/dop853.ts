/**
 * Dormand–Prince 8(5,3) ("DOP853"): an explicit Runge–Kutta method of order 8 with an embedded error
 * estimate built from a 5th- and a 3rd-order pair, and a continuous extension of order 7 (dense output)
 * that costs three extra evaluations per step, made only for steps where it is asked for.
 *
 * Method and coefficients: Hairer, Nørsett & Wanner 1993, Solving Ordinary Differential Equations I:
 * Nonstiff Problems, 2nd ed., Springer, §II.10 (the DOP853 code, with its error estimator
 * err = h·‖e5‖² / √(‖e5‖² + 0.01‖e3‖²) and its dense output, §II.6); Prince & Dormand 1981, J. Comput.
 * Appl. Math. 7, 67. The coefficient table below is transcribed (decimal values rounded to the nearest
 * double) from the table that scipy (BSD-3 licence) carries in scipy/integrate/_ivp/dop853_coefficients.py,
 * which reproduces the constants of Hairer's Fortran dop853.f. The tests check the method on problems with
 * known solutions (harmonic oscillator, Kepler two-body orbit) and its order of convergence.
 *
 * Step-size control (Hairer et al. 1993, §II.4, eq. 4.13, with DOP853's safety factor 0.9, growth bounds
 * 0.2–6, and no growth on the step after a rejection): h_new = h · clamp(0.9 · err^(−1/8)); the error is the root mean square of the
 * component errors scaled by atol + rtol·max(|y_old|, |y_new|). Deterministic: no wall-clock limit; the
 * caller bounds the number of steps, and a step below the minimum step (about 10 ulps of t — 10·ε·|t| — or the caller's)
 * stops the integration with a status instead of crawling.
 */

// Coefficients of DOP853 (see the module comment for their source). A[s] holds a_{s,0..s−1};
// row 12 is b (the 8th-order weights); rows 13–15 are the extra stages of the dense output.
const C: readonly number[] = [0.0, 0.05260015195876773, 0.0789002279381516, 0.1183503419072274, 0.2816496580927726, 0.3333333333333333, 0.25, 0.3076923076923077, 0.6512820512820513, 0.6, 0.8571428571428571, 1.0, 1.0, 0.1, 0.2, 0.7777777777777778];
const A: readonly (readonly number[])[] = [
  [],
  [0.05260015195876773],
  [0.0197250569845379, 0.0591751709536137],
  [0.02958758547680685, 0.0, 0.08876275643042054],
  [0.2413651341592667, 0.0, -0.8845494793282861, 0.924834003261792],
  [0.037037037037037035, 0.0, 0.0, 0.17082860872947386, 0.12546768756682242],
  [0.037109375, 0.0, 0.0, 0.17025221101954405, 0.06021653898045596, -0.017578125],
  [0.03709200011850479, 0.0, 0.0, 0.17038392571223998, 0.10726203044637328, -0.015319437748624402, 0.008273789163814023],
  [0.6241109587160757, 0.0, 0.0, -3.3608926294469414, -0.868219346841726, 27.59209969944671, 20.154067550477894, -43.48988418106996],
  [0.47766253643826434, 0.0, 0.0, -2.4881146199716677, -0.590290826836843, 21.230051448181193, 15.279233632882423, -33.28821096898486, -0.020331201708508627],
  [-0.9371424300859873, 0.0, 0.0, 5.186372428844064, 1.0914373489967295, -8.149787010746927, -18.52006565999696, 22.739487099350505, 2.4936055526796523, -3.0467644718982196],
  [2.273310147516538, 0.0, 0.0, -10.53449546673725, -2.0008720582248625, -17.9589318631188, 27.94888452941996, -2.8589982771350235, -8.87285693353063, 12.360567175794303, 0.6433927460157636],
  [0.054293734116568765, 0.0, 0.0, 0.0, 0.0, 4.450312892752409, 1.8915178993145003, -5.801203960010585, 0.3111643669578199, -0.1521609496625161, 0.20136540080403034, 0.04471061572777259],
  [0.056167502283047954, 0.0, 0.0, 0.0, 0.0, 0.0, 0.25350021021662483, -0.2462390374708025, -0.12419142326381637, 0.15329179827876568, 0.00820105229563469, 0.007567897660545699, -0.008298],
  [0.03183464816350214, 0.0, 0.0, 0.0, 0.0, 0.028300909672366776, 0.053541988307438566, -0.05492374857139099, 0.0, 0.0, -0.00010834732869724932, 0.0003825710908356584, -0.00034046500868740456, 0.1413124436746325],
  [-0.42889630158379194, 0.0, 0.0, 0.0, 0.0, -4.697621415361164, 7.683421196062599, 4.06898981839711, 0.3567271874552811, 0.0, 0.0, 0.0, -0.0013990241651590145, 2.9475147891527724, -9.15095847217987],
];
const E3: readonly number[] = [-0.18980075407240762, 0.0, 0.0, 0.0, 0.0, 4.450312892752409, 1.8915178993145003, -5.801203960010585, -0.4226823213237919, -0.1521609496625161, 0.20136540080403034, 0.02265179219836082, 0.0];
const E5: readonly number[] = [0.01312004499419488, 0.0, 0.0, 0.0, 0.0, -1.2251564463762044, -0.4957589496572502, 1.6643771824549864, -0.35032884874997366, 0.3341791187130175, 0.08192320648511571, -0.022355307863886294, 0.0];
const D: readonly (readonly number[])[] = [
  [-8.428938276109013, 0.0, 0.0, 0.0, 0.0, 0.5667149535193777, -3.0689499459498917, 2.38466765651207, 2.117034582445028, -0.871391583777973, 2.2404374302607883, 0.6315787787694688, -0.08899033645133331, 18.148505520854727, -9.194632392478356, -4.436036387594894],
  [10.427508642579134, 0.0, 0.0, 0.0, 0.0, 242.28349177525817, 165.20045171727028, -374.5467547226902, -22.113666853125306, 7.733432668472264, -30.674084731089398, -9.332130526430229, 15.697238121770845, -31.139403219565178, -9.35292435884448, 35.81684148639408],
  [19.985053242002433, 0.0, 0.0, 0.0, 0.0, -387.0373087493518, -189.17813819516758, 527.8081592054236, -11.57390253995963, 6.8812326946963, -1.0006050966910838, 0.7777137798053443, -2.778205752353508, -60.19669523126412, 84.32040550667716, 11.99229113618279],
  [-25.69393346270375, 0.0, 0.0, 0.0, 0.0, -154.18974869023643, -231.5293791760455, 357.6391179106141, 93.40532418362432, -37.45832313645163, 104.0996495089623, 29.8402934266605, -43.53345659001114, 96.32455395918828, -39.17726167561544, -149.72683625798564],
];

/** A first-order system y' = f(t, y) of dimension n; f writes into dydt and must not keep the arrays. */
export interface OdeSystem {
  readonly n: number;
  rhs(t: number, y: Float64Array, dydt: Float64Array): void;
}

export interface Dop853Options {
  /** Relative tolerance per component (default 1e−10). */
  rtol?: number;
  /** Absolute tolerance per component (default rtol · 1e−3). */
  atol?: number;
  /** First step; by default chosen by the Hairer et al. (1993, §II.4) starting-step algorithm. */
  firstStep?: number;
  /** Largest step magnitude (default ∞). */
  maxStep?: number;
  /** Smallest step magnitude allowed before giving up (default 0: only the 10-ulp floor applies). */
  minStep?: number;
  /** Direction of integration: +1 (default) or −1. */
  direction?: 1 | -1;
}

/** What one call of step() did. */
export type StepStatus = 'accepted' | 'stepTooSmall' | 'notFinite';

const N_STAGES = 12;
const SAFETY = 0.9;
const MIN_FACTOR = 0.2;
const MAX_FACTOR = 6;
const EXPONENT = -1 / 8;

/** The integrator's state: the last accepted step [tOld, t] and its dense output on demand. */
export class Dop853 {
  readonly n: number;
  t: number;
  tOld: number;
  readonly y: Float64Array;
  readonly yOld: Float64Array;
  /** f(t, y) at the current point (first-same-as-last). */
  readonly f: Float64Array;
  /** Last accepted step (signed). */
  hLast = 0;
  /** Counts: accepted and rejected steps, right-hand-side evaluations. */
  accepted = 0;
  rejected = 0;
  evaluations = 0;
  private h: number;
  private readonly rtol: number;
  private readonly atol: number;
  private readonly maxStep: number;
  private readonly minStep: number;
  private readonly direction: 1 | -1;
  private readonly sys: OdeSystem;
  private readonly k: Float64Array[];
  private readonly tmp: Float64Array;
  private readonly acc: Float64Array;
  private readonly yNew: Float64Array;
  private readonly fOld: Float64Array;
  private readonly dense: Float64Array[];
  private denseReady = false;

  constructor(sys: OdeSystem, t0: number, y0: ArrayLike<number>, options: Dop853Options = {}) {
    const n = sys.n;
    this.sys = sys;
    this.n = n;
    this.rtol = options.rtol ?? 1e-10;
    this.atol = options.atol ?? this.rtol * 1e-3;
    this.maxStep = options.maxStep ?? Number.POSITIVE_INFINITY;
    this.minStep = options.minStep ?? 0;
    this.direction = options.direction ?? 1;
    this.t = t0;
    this.tOld = t0;
    this.y = Float64Array.from(y0);
    this.yOld = Float64Array.from(y0);
    this.f = new Float64Array(n);
    this.fOld = new Float64Array(n);
    this.tmp = new Float64Array(n);
    this.acc = new Float64Array(n);
    this.yNew = new Float64Array(n);
    this.k = Array.from({ length: 16 }, () => new Float64Array(n));
    this.dense = Array.from({ length: 7 }, () => new Float64Array(n));
    sys.rhs(t0, this.y, this.f);
    this.evaluations = 1;
    this.h = options.firstStep ?? this.initialStep();
  }

  private scaledNorm(v: Float64Array, y: Float64Array): number {
    let s = 0;
    for (let i = 0; i < this.n; i++) {
      const x = v[i]! / (this.atol + this.rtol * Math.abs(y[i]!));
      s += x * x;
    }
    return Math.sqrt(s / this.n);
  }

  /** Starting step (Hairer, Nørsett & Wanner 1993, §II.4, "Starting step size"), for order 8. */
  private initialStep(): number {
    const d0 = this.scaledNorm(this.y, this.y);
    const d1 = this.scaledNorm(this.f, this.y);
    let h0 = d0 < 1e-5 || d1 < 1e-5 ? 1e-6 : (0.01 * d0) / d1;
    h0 = Math.min(h0, this.maxStep);
    const y1 = this.tmp;
    for (let i = 0; i < this.n; i++) y1[i] = this.y[i]! + this.direction * h0 * this.f[i]!;
    const f1 = this.k[1]!;
    this.sys.rhs(this.t + this.direction * h0, y1, f1);
    this.evaluations++;
    for (let i = 0; i < this.n; i++) y1[i] = f1[i]! - this.f[i]!;
    const d2 = this.scaledNorm(y1, this.y) / h0;
    const h1 = Math.max(d1, d2) <= 1e-15 ? Math.max(1e-6, h0 * 1e-3) : (0.01 / Math.max(d1, d2)) ** (1 / 8);
    return this.direction * Math.min(100 * h0, h1, this.maxStep);
  }

  /**
   * Takes one accepted step (retrying rejected ones inside), unless the step would fall below the
   * minimum or the state stops being finite. `hLimit` (> 0) caps the magnitude of this step, e.g. to
   * land exactly on an end point.
   */
  step(hLimit = Number.POSITIVE_INFINITY): StepStatus {
    const n = this.n;
    const { k, tmp, yNew, y } = this;
    let rejectedHere = false;
    for (;;) {
      const floor = Math.max(this.minStep, 10 * Number.EPSILON * Math.abs(this.t), Number.MIN_VALUE);
      let h = this.direction * Math.min(Math.abs(this.h), this.maxStep, hLimit);
      if (Math.abs(h) < floor) {
        if (hLimit < floor && hLimit > 0) h = this.direction * hLimit;
        else return 'stepTooSmall';
      }
      const t = this.t;
      k[0]!.set(this.f);
      for (let s = 1; s < N_STAGES; s++) {
        this.combine(y, h, A[s]!, s, tmp);
        this.sys.rhs(t + C[s]! * h, tmp, k[s]!);
      }
      this.combine(y, h, A[N_STAGES]!, N_STAGES, yNew);
      const fNew = k[N_STAGES]!;
      this.sys.rhs(t + h, yNew, fNew);
      this.evaluations += N_STAGES;
      // Error estimate (Hairer et al. 1993, DOP853): err5 and err3 over the 13 stages.
      let e5 = 0;
      let e3 = 0;
      let finite = true;
      for (let i = 0; i < n; i++) {
        const sc = this.atol + this.rtol * Math.max(Math.abs(y[i]!), Math.abs(yNew[i]!));
        let s5 = 0;
        let s3 = 0;
        for (let j = 0; j <= N_STAGES; j++) {
          const kj = k[j]![i]!;
          s5 += E5[j]! * kj;
          s3 += E3[j]! * kj;
        }
        const x5 = s5 / sc;
        const x3 = s3 / sc;
        e5 += x5 * x5;
        e3 += x3 * x3;
        if (!Number.isFinite(yNew[i]!) || !Number.isFinite(fNew[i]!)) finite = false;
      }
      let err = 0;
      if (e5 > 0 || e3 > 0) err = (Math.abs(h) * e5) / Math.sqrt((e5 + 0.01 * e3) * n);
      if (!finite || !Number.isFinite(err)) {
        // A step that leaves the domain (or overflows) is retried smaller, down to the floor.
        if (Math.abs(h) <= floor) return 'notFinite';
        this.h = h * MIN_FACTOR;
        this.rejected++;
        rejectedHere = true;
        continue;
      }
      if (err <= 1) {
        let factor = err === 0 ? MAX_FACTOR : Math.min(MAX_FACTOR, SAFETY * err ** EXPONENT);
        if (rejectedHere) factor = Math.min(factor, 1);
        this.tOld = t;
        this.yOld.set(y);
        this.fOld.set(this.f);
        this.t = t + h;
        y.set(yNew);
        this.f.set(fNew);
        this.hLast = h;
        this.h = h * factor;
        this.accepted++;
        this.denseReady = false;
        return 'accepted';
      }
      this.h = h * Math.max(MIN_FACTOR, SAFETY * err ** EXPONENT);
      this.rejected++;
      rejectedHere = true;
    }
  }

  /** out = base + h Σ_{j<s} a_j k_j, skipping the tableau's zero coefficients. */
  private combine(base: Float64Array, h: number, a: readonly number[], s: number, out: Float64Array): void {
    const n = this.n;
    const acc = this.acc;
    acc.fill(0);
    for (let j = 0; j < s; j++) {
      const aj = a[j]!;
      if (aj === 0) continue;
      const kj = this.k[j]!;
      for (let i = 0; i < n; i++) acc[i]! += aj * kj[i]!;
    }
    for (let i = 0; i < n; i++) out[i] = base[i]! + h * acc[i]!;
  }

  /** Builds the 7th-order continuous extension of the last step (three more evaluations). */
  private prepareDense(): void {
    const n = this.n;
    const { k, tmp, dense } = this;
    const h = this.hLast;
    const t = this.tOld;
    // Stage 12 of the extended tableau is f(t + h, y_new), already in k[12].
    for (let s = 13; s < 16; s++) {
      this.combine(this.yOld, h, A[s]!, s, tmp);
      this.sys.rhs(t + C[s]! * h, tmp, k[s]!);
    }
    this.evaluations += 3;
    for (let i = 0; i < n; i++) {
      const dy = this.y[i]! - this.yOld[i]!;
      dense[0]![i] = dy;
      dense[1]![i] = h * this.fOld[i]! - dy;
      dense[2]![i] = 2 * dy - h * (this.f[i]! + this.fOld[i]!);
      for (let r = 0; r < 4; r++) {
        const d = D[r]!;
        let acc = 0;
        for (let j = 0; j < 16; j++) acc += d[j]! * k[j]![i]!;
        dense[3 + r]![i] = h * acc;
      }
    }
    this.denseReady = true;
  }

  /**
   * The solution at time s within the last step [tOld, t], by the continuous extension:
   * y(x) = y_old + x(F0 + (1−x)(F1 + x(F2 + (1−x)(F3 + x(F4 + (1−x)(F5 + x F6)))))), x = (s − tOld)/h.
   */
  interpolate(s: number, out: Float64Array): void {
    if (!this.denseReady) this.prepareDense();
    const x = (s - this.tOld) / this.hLast;
    const x1 = 1 - x;
    const d = this.dense;
    for (let i = 0; i < this.n; i++) {
      const v = d[0]![i]! + x1 * (d[1]![i]! + x * (d[2]![i]! + x1 * (d[3]![i]! + x * (d[4]![i]! + x1 * (d[5]![i]! + x * d[6]![i]!)))));
      out[i] = this.yOld[i]! + x * v;
    }
  }
}
