/**
 * Angle between implant axes.
 *
 * θ = arccos(u·v ÷ (|u||v|)) [derived]; the cosine is clamped to [−1, 1] before arccos so rounding
 * can never produce NaN. Impressions stayed accurate below about 15° of divergence, with framework
 * gaps at 20° (Jang HK et al. 2011, Int J Oral Maxillofac Implants 26:1011–1015) [pub].
 */
import { ValidationError } from './errors.js';
import { requireArray, requireFinite } from './validate.js';

/** A 3-D direction vector, any units (only the direction matters). */
export type Vec3 = [number, number, number];

/** Divergence above which impression accuracy suffers, degrees (Jang 2011) [pub]. */
export const DIVERGENCE_LIMIT_DEG = 15;

function checkVector(v: unknown, field: string): Vec3 {
  const arr = requireArray(v, field);
  if (arr.length !== 3) throw new ValidationError('bad-value', 'Enter all three components of the axis', field);
  const out = arr.map((c, i) => requireFinite(c, `${field}[${i}]`)) as Vec3;
  if (out[0] === 0 && out[1] === 0 && out[2] === 0) {
    throw new ValidationError('zero-vector', 'An axis of 0, 0, 0 has no direction; enter the implant axis', field);
  }
  return out;
}

/** Scales a vector by its largest |component| so squares and products cannot overflow or underflow. */
function normalise(v: Vec3): Vec3 {
  const m = Math.max(Math.abs(v[0]), Math.abs(v[1]), Math.abs(v[2]));
  return [v[0] / m, v[1] / m, v[2] / m];
}

/**
 * Angle between two axis vectors, degrees, in [0, 180]. Symmetric in its arguments.
 * @throws ValidationError `zero-vector` for a zero vector, `not-a-number` for NaN/±Infinity components
 */
export function divergenceDeg(a: Vec3, b: Vec3): number {
  const u = normalise(checkVector(a, 'a'));
  const v = normalise(checkVector(b, 'b'));
  const dot = u[0] * v[0] + u[1] * v[1] + u[2] * v[2];
  const cos = dot / (Math.hypot(u[0], u[1], u[2]) * Math.hypot(v[0], v[1], v[2]));
  return (Math.acos(Math.min(1, Math.max(-1, cos))) * 180) / Math.PI;
}
