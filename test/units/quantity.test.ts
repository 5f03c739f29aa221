/**
 * Quantity parsing: units through the mathjs unit parser only, astronomy units from the standards,
 * the body's own scales rg and tg.
 */
import { describe, expect, it } from 'vitest';
import { AU, C, GM_SUN, G, PARSEC } from '../../src/units/constants.js';
import { QuantityError, toLength, toSI } from '../../src/units/quantity.js';

const scale = { rg: 14766.25, tg: 14766.25 / C };

describe('toSI', () => {
  it('passes SI numbers and plain numeric strings through', () => {
    expect(toSI(5, 'mass')).toBe(5);
    expect(toSI('2.5e3', 'length')).toBe(2500);
  });

  it('reads astronomy units from the standards', () => {
    expect(toSI('10 Msun', 'mass')).toBeCloseTo((10 * GM_SUN) / G, -20);
    expect(toSI('1 AU', 'length')).toBe(AU); // IAU 2012 Resolution B2: 149 597 870 700 m exactly
    expect(toSI('1 au', 'length')).toBe(AU);
    expect(toSI('1 pc', 'length') / 3.0856775814913673e16).toBeCloseTo(1, 14); // IAU 2015 B2: 648000/π au
    expect(toSI('1 Mpc', 'length')).toBeCloseTo(1e6 * PARSEC, -8);
    expect(toSI('1 ly', 'length')).toBe(9_460_730_472_580_800); // c × Julian year, IAU
    expect(toSI('1 Rsun', 'length')).toBe(6.957e8); // IAU 2015 B3 nominal
  });

  it('reads ordinary units, angles and speeds in c', () => {
    expect(toSI('35786 km', 'length')).toBe(35_786_000);
    expect(toSI('60 deg', 'angle')).toBeCloseTo(Math.PI / 3, 15);
    expect(toSI('0.5 c', 'speed')).toBe(C / 2);
    // mathjs's arcsec constant is rounded at the 16th digit: 1e-15 relative.
    expect(Math.abs(toSI('1 mas', 'angle') / (Math.PI / (180 * 3600 * 1000)) - 1)).toBeLessThan(1e-15);
    expect(toSI('5.86e33 kg m^2/s', 'angularMomentum')).toBe(5.86e33);
    expect(toSI('1e20 C', 'charge')).toBe(1e20);
  });

  it('reads rg and tg against the body, and refuses them without one', () => {
    expect(toSI('6 rg', 'length', scale)).toBeCloseTo(6 * scale.rg, 9);
    expect(toSI('100 tg', 'time', scale)).toBeCloseTo(100 * scale.tg, 15);
    expect(() => toSI('6 rg', 'length')).toThrow(QuantityError);
    expect(() => toSI('6 rg', 'time', scale)).toThrow(/length/);
  });

  it('keeps a length in rg exact as its geometric value', () => {
    const l = toLength('6 rg', scale);
    expect(l.geometric).toBe(6);
    expect(l.si).toBe(6 * scale.rg);
    expect(toLength('1 km', scale).geometric).toBeCloseTo(1000 / scale.rg, 14);
  });

  it('never evaluates expressions, and refuses unknown units, wrong dimensions and non-finite values', () => {
    for (const text of ['sqrt(4) m', '1+1 kg', '2*3 m', 'x = 5', 'import("fs")', '10 parsecs', '']) {
      expect(() => toSI(text, 'length'), text).toThrow(QuantityError);
    }
    expect(() => toSI('10 m', 'mass')).toThrow(/not a mass/);
    expect(() => toSI('1e400 m', 'length')).toThrow(/finite/);
    expect(() => toSI(Number.POSITIVE_INFINITY, 'length')).toThrow(/finite/);
    expect(() => toSI('kg', 'mass')).toThrow(QuantityError);
    expect(() => toSI(`${'9'.repeat(70)} m`, 'length')).toThrow(/longer than/);
  });
});
