/**
 * Geometric (G = c = M = 1) values to response quantities { value, unit, geometric, reason }.
 */
import { quantityInfo, siFactor, type BodyScales } from '../catalogue.js';

export interface QuantityValue {
  /** SI value, or null where the quantity does not exist here (then `reason` says why). */
  value: number | null;
  unit: string;
  /** Value in units of M (G = c = 1), for quantities that have a dimension. */
  geometric?: number | null;
  reason?: string;
}

const NOT_FINITE = 'the value is not finite in double precision here';

/** Builds the response form of catalogue quantity `name` from its geometric value. */
export function toQuantity(
  name: string,
  geometric: number,
  scales: BodyScales,
  reason?: string,
): QuantityValue {
  const info = quantityInfo(name);
  const si = geometric * siFactor(info.scale, scales);
  const ok = Number.isFinite(geometric) && Number.isFinite(si);
  const out: QuantityValue = { value: ok ? si : null, unit: info.unit };
  if (info.geometricUnit !== null) out.geometric = ok ? geometric : null;
  if (!ok) out.reason = reason ?? NOT_FINITE;
  return out;
}
