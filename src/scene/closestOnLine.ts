import type { Ray, Vector3 } from 'three'

/**
 * Parameter s of the point P + s·m on the line through P with unit direction m that is closest
 * to the ray (closest points of two lines), or NaN when the ray runs parallel to the line and
 * no drag direction can be read from it.
 */
export function closestOnLine(P: Vector3, m: Vector3, ray: Ray): number {
  const o = ray.origin, d = ray.direction
  const wx = P.x - o.x, wy = P.y - o.y, wz = P.z - o.z
  const b = m.x * d.x + m.y * d.y + m.z * d.z
  const c = d.x * d.x + d.y * d.y + d.z * d.z
  const dm = m.x * wx + m.y * wy + m.z * wz
  const e = d.x * wx + d.y * wy + d.z * wz
  const denom = c - b * b // a = m·m = 1
  if (!(Math.abs(denom) > 1e-9 * c)) return NaN
  return (b * e - c * dm) / denom
}
