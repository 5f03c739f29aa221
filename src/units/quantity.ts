/**
 * Parsing of quantities sent by clients: a number in the SI unit, or a string "<number> <unit>".
 *
 * Strings go through the mathjs unit parser only (Unit.parse via math.unit): it reads a number and a
 * unit expression and nothing else — no user text is ever evaluated as an expression. mathjs units are
 * extended with astronomy units (Msun, Mearth, Rsun, Rearth, AU/au, pc, ly, yr), speeds in c, angles in
 * mas and uas, and two units that belong to the request's body: rg = GM/c² (length) and tg = GM/c³
 * (time). "rg" would otherwise read as a ronto-gram; it is redefined here.
 */
import { create, all, type Unit } from 'mathjs';
import {
  AU,
  C,
  JULIAN_YEAR,
  LIGHT_YEAR,
  M_EARTH,
  M_SUN,
  PARSEC,
  R_EARTH_NOMINAL,
  R_SUN,
} from './constants.js';

const math = create(all ?? {});

math.createUnit('rg', {}, { override: true });
math.createUnit('tg');
math.createUnit('c', { definition: `${C} m/s` });
math.createUnit('Msun', { definition: `${M_SUN} kg` });
math.createUnit('Mearth', { definition: `${M_EARTH} kg` });
math.createUnit('Rsun', { definition: `${R_SUN} m` });
math.createUnit('Rearth', { definition: `${R_EARTH_NOMINAL} m` });
math.createUnit('AU', { definition: `${AU} m`, aliases: ['au'] });
math.createUnit('pc', { definition: `${PARSEC} m`, prefixes: 'short' });
math.createUnit('ly', { definition: `${LIGHT_YEAR} m` });
math.createUnit('yr', { definition: `${JULIAN_YEAR} s`, prefixes: 'short' });
math.createUnit('mas', { definition: '1e-3 arcsec' });
math.createUnit('uas', { definition: '1e-6 arcsec' });

/** The kinds of quantity a request may carry, each with the SI unit it is converted to. */
export const DIMENSIONS = {
  none: '',
  mass: 'kg',
  length: 'm',
  time: 's',
  angle: 'rad',
  speed: 'm/s',
  charge: 'C',
  angularMomentum: 'kg m^2/s',
  angularVelocity: 'rad/s',
} as const;
export type Dimension = keyof typeof DIMENSIONS;

/** The body's scales that the units rg and tg refer to. */
export interface BodyScale {
  /** GM/c² in m. */
  rg: number;
  /** GM/c³ in s. */
  tg: number;
}

/** Longest quantity string accepted (documented limit). */
export const MAX_QUANTITY_LENGTH = 64;

/** A quantity the client sent that cannot be read; the API maps it to a 400 with the field's path. */
export class QuantityError extends Error {}

const reference = Object.fromEntries(
  Object.entries(DIMENSIONS)
    .filter(([, u]) => u !== '')
    .map(([k, u]) => [k, math.unit(u)]),
) as Record<Exclude<Dimension, 'none'>, Unit>;
const rgUnit = math.unit('rg');
const tgUnit = math.unit('tg');

const PLAIN_NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/** Whether the input is a number or a string holding only a decimal number (no unit, no hex). */
export function isPlainNumber(input: number | string): boolean {
  return typeof input === 'number' || PLAIN_NUMBER.test(input.trim());
}

/** A parsed quantity string, with its conversions done once (strings recur across requests). */
interface Parsed {
  /** 'rg' or 'tg' when the unit is one of the body's scales, else null. */
  bodyScale: 'rg' | 'tg' | null;
  /** The number in units of rg or tg, when bodyScale is set. */
  scaled: number;
  /** The dimension the unit belongs to (null if none of ours), and the value in its SI unit. */
  dimension: Exclude<Dimension, 'none'> | null;
  si: number;
}

// Parsing takes ~10 µs with mathjs; the memo keeps requests off that path for repeated spellings.
const memo = new Map<string, Parsed>();
const MEMO_LIMIT = 2048;

function parseUnitString(text: string): Parsed {
  const hit = memo.get(text);
  if (hit) return hit;
  let unit: Unit;
  try {
    unit = math.unit(text);
  } catch (err) {
    throw new QuantityError(`cannot read "${text}" as a number with a unit: ${(err as Error).message}`);
  }
  if (unit.value === null) throw new QuantityError(`"${text}" has a unit but no number`);
  const parsed: Parsed = { bodyScale: null, scaled: Number.NaN, dimension: null, si: Number.NaN };
  if (unit.equalBase(rgUnit)) parsed.bodyScale = 'rg';
  else if (unit.equalBase(tgUnit)) parsed.bodyScale = 'tg';
  if (parsed.bodyScale) {
    parsed.scaled = unit.toNumber(parsed.bodyScale);
  } else {
    for (const [dim, ref] of Object.entries(reference) as [Exclude<Dimension, 'none'>, Unit][]) {
      if (unit.equalBase(ref)) {
        parsed.dimension = dim;
        parsed.si = unit.toNumber(DIMENSIONS[dim]);
        break;
      }
    }
  }
  if (memo.size >= MEMO_LIMIT) memo.clear();
  memo.set(text, parsed);
  return parsed;
}

/** Whether a string quantity refers to the body's own scales (rg, tg) and so needs the mass first. */
export function needsBodyScale(input: number | string): boolean {
  if (typeof input === 'number') return false;
  const text = input.trim();
  if (text.length === 0 || text.length > MAX_QUANTITY_LENGTH || PLAIN_NUMBER.test(text)) return false;
  try {
    return parseUnitString(text).bodyScale !== null;
  } catch {
    return false;
  }
}

/**
 * Reads a length as { si (m), geometric (units of GM/c²) }. A length given in rg keeps its number
 * exactly as the geometric value ("6 rg" is 6, not 6·rg/rg with rounding).
 */
export function toLength(input: number | string, scale: BodyScale): { si: number; geometric: number } {
  if (typeof input === 'string') {
    const text = input.trim();
    if (text.length > 0 && text.length <= MAX_QUANTITY_LENGTH && !PLAIN_NUMBER.test(text)) {
      const { bodyScale, scaled } = parseUnitString(text);
      if (bodyScale === 'rg') {
        const geometric = scaled;
        if (!Number.isFinite(geometric)) throw new QuantityError('the value is not a finite number');
        return { si: geometric * scale.rg, geometric };
      }
    }
  }
  const si = toSI(input, 'length', scale);
  return { si, geometric: si / scale.rg };
}

/**
 * Converts a client quantity to its SI value. Throws QuantityError for text that is not a number with
 * a unit of the right dimension, for rg/tg without a body, and for values that are not finite.
 */
export function toSI(input: number | string, dimension: Dimension, scale?: BodyScale): number {
  let value: number;
  if (typeof input === 'number') {
    value = input;
  } else {
    const text = input.trim();
    if (text.length === 0) throw new QuantityError('empty quantity');
    if (text.length > MAX_QUANTITY_LENGTH) {
      throw new QuantityError(`quantity text longer than ${MAX_QUANTITY_LENGTH} characters`);
    }
    if (PLAIN_NUMBER.test(text)) {
      value = Number(text);
    } else {
      if (dimension === 'none') throw new QuantityError(`"${text}" must be a plain number here`);
      const parsed = parseUnitString(text);
      const { bodyScale } = parsed;
      if (bodyScale !== null) {
        const wanted = bodyScale === 'rg' ? 'length' : 'time';
        if (dimension !== wanted) {
          throw new QuantityError(`"${text}" is a ${wanted}, but a ${dimension} is expected here`);
        }
        if (!scale) throw new QuantityError(`"${text}" needs the body's mass to be known`);
        value = parsed.scaled * scale[bodyScale];
      } else if (parsed.dimension === dimension) {
        value = parsed.si;
      } else {
        throw new QuantityError(
          `"${text}" is not a ${dimension} (expected a unit convertible to ${DIMENSIONS[dimension]})`,
        );
      }
    }
  }
  if (!Number.isFinite(value)) throw new QuantityError('the value is not a finite number');
  return value;
}
