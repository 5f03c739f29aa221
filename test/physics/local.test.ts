/**
 * Which local quantities exist where, and the reason given where one does not.
 */
import { describe, expect, it } from 'vitest';
import { evaluateLocal, LOCAL_QUANTITIES, REASONS } from '../../src/physics/local.js';
import { horizons } from '../../src/physics/spacetime.js';

describe('evaluateLocal', () => {
  it('outside: every quantity exists and no reason is given', () => {
    const l = evaluateLocal({ a: 0.9, q: 0.2 }, 10, 1.1);
    expect(l.region).toBe('outside');
    for (const n of LOCAL_QUANTITIES) expect(Number.isFinite(l.values[n]), n).toBe(true);
    expect(l.reasons).toEqual({});
    expect(l.values.escapeSpeed).toBe(l.values.flowSpeed);
  });

  it('ergoregion: no static observers, but ZAMOs and the flow exist', () => {
    const l = evaluateLocal({ a: 0.9, q: 0 }, 1.8, Math.PI / 2);
    expect(l.region).toBe('ergoregion');
    for (const n of ['staticClockRate', 'staticClockOffset', 'redshiftToInfinity', 'hoverAcceleration'] as const) {
      expect(l.values[n]).toBeNaN();
      expect(l.reasons[n]).toBe(REASONS.ergoregion);
    }
    expect(l.values.zamoClockRate).toBeGreaterThan(0);
    expect(l.values.flowSpeed).toBeLessThan(1);
    expect(l.values.frameDragRate).toBeGreaterThan(0);
  });

  it('between the horizons: the flow exceeds c; nothing escapes; no clock compares with far away', () => {
    const l = evaluateLocal({ a: 0.5, q: 0.3 }, 1.2, 1);
    expect(l.region).toBe('betweenHorizons');
    expect(l.values.flowSpeed).toBeGreaterThan(1);
    expect(l.reasons.escapeSpeed).toBe(REASONS.escapeInside);
    expect(l.reasons.zamoClockRate).toBe(REASONS.insideHorizon);
    expect(l.reasons.frameDragRate).toBe(REASONS.insideHorizon);
    expect(l.river).not.toBeNull();
  });

  it('deep inside a charged hole (2r < Q²) the flow has no real speed and river coordinates end', () => {
    const s = { a: 0, q: 0.8 };
    const l = evaluateLocal(s, 0.1, 1);
    expect(l.region).toBe('insideInnerHorizon');
    expect(0.1).toBeLessThan(horizons(s)!.inner);
    expect(l.values.flowSpeed).toBeNaN();
    expect(l.reasons.flowSpeed).toBe(REASONS.noFlow);
    expect(l.river).toBeNull();
  });

  it('no horizon, g_φφ < 0 near the centre of a spinning, charged mass: the ZAMO is missing for that reason, not for want of flow', () => {
    // a = 0.5, Q = 1.2 (no horizon), r = 0.1 at the equator: A = (r²+a²)² − a²Δ = 0.0676 − 0.25·1.5 < 0
    // and 2r < Q². The ZAMO needs only A > 0; the flow needs 2r ≥ Q² as well.
    const l = evaluateLocal({ a: 0.5, q: 1.2 }, 0.1, Math.PI / 2, 0.05);
    expect(l.region).toBe('outside');
    for (const n of ['zamoClockRate', 'zamoClockOffset', 'frameDragRate'] as const) {
      expect(l.values[n], n).toBeNaN();
      expect(l.reasons[n], n).toBe(REASONS.noCausalRegion);
    }
    expect(l.reasons.flowSpeed).toBe(REASONS.noFlow);
    expect(l.reasons.escapeSpeed).toBe(REASONS.noCausalRegion);
    // Where 2r < Q² but A > 0 the ZAMO exists (its clock runs faster than far-away clocks).
    const z = evaluateLocal({ a: 0.5, q: 1.2 }, 0.5, Math.PI / 2, 0.05);
    expect(z.values.flowSpeed).toBeNaN();
    expect(z.values.zamoClockRate).toBeGreaterThan(1);
    expect(z.reasons.zamoClockRate).toBeUndefined();
    // E = α > 1 for a body at rest there: no launch has the marginal energy E = 1.
    expect(z.values.escapeSpeed).toBeNaN();
    expect(z.reasons.escapeSpeed).toBe(REASONS.noMarginalEscape);
  });

  it('on the outer horizon the flow speed is c and ω is the horizon angular velocity', () => {
    const s = { a: 1, q: 0 }; // r+ = 1 exactly
    const l = evaluateLocal(s, 1, Math.PI / 2);
    expect(l.region).toBe('outerHorizon');
    expect(l.values.flowSpeed).toBe(1);
    expect(l.values.frameDragRate).toBe(0.5); // Ω_H = a/(r+² + a²) = 1/2
    expect(l.reasons.staticClockRate).toBe(REASONS.onHorizon);
  });
});
