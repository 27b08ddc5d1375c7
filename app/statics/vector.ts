// Small 3-vector and 3x3 helpers for the hot solve path: plain objects, closed-form math.

export interface Vec3 {
  x: number;
  y: number;
  z: number;
}

/** A 3x3 matrix in row-major order: [a00, a01, a02, a10, ..., a22]. */
export type Mat3 = [number, number, number, number, number, number, number, number, number];

/** Builds a vector from its components (any unit). */
export function vec3(x: number, y: number, z: number): Vec3 {
  return { x, y, z };
}

/** a + b. */
export function add(a: Vec3, b: Vec3): Vec3 {
  return { x: a.x + b.x, y: a.y + b.y, z: a.z + b.z };
}

/** a - b. */
export function sub(a: Vec3, b: Vec3): Vec3 {
  return { x: a.x - b.x, y: a.y - b.y, z: a.z - b.z };
}

/** s * a. */
export function scale(a: Vec3, s: number): Vec3 {
  return { x: a.x * s, y: a.y * s, z: a.z * s };
}

/** Dot product a . b. */
export function dot(a: Vec3, b: Vec3): number {
  return a.x * b.x + a.y * b.y + a.z * b.z;
}

/** Cross product a x b. */
export function cross(a: Vec3, b: Vec3): Vec3 {
  return { x: a.y * b.z - a.z * b.y, y: a.z * b.x - a.x * b.z, z: a.x * b.y - a.y * b.x };
}

/** Euclidean length |a|. */
export function norm(a: Vec3): number {
  return Math.sqrt(a.x * a.x + a.y * a.y + a.z * a.z);
}

/** Distance |a - b|. */
export function distance(a: Vec3, b: Vec3): number {
  const dx = a.x - b.x;
  const dy = a.y - b.y;
  const dz = a.z - b.z;
  return Math.sqrt(dx * dx + dy * dy + dz * dz);
}

/** a / |a|, or null when |a| is below minLength. */
export function normalize(a: Vec3, minLength = 1e-12): Vec3 | null {
  const n = norm(a);
  if (!(n > minLength)) return null;
  return { x: a.x / n, y: a.y / n, z: a.z / n };
}

/** Angle between two vectors in degrees, 0..180 (0 when either is zero). */
export function angleBetweenDeg(a: Vec3, b: Vec3): number {
  const na = norm(a);
  const nb = norm(b);
  if (!(na > 0) || !(nb > 0)) return 0;
  // atan2 of |a x b| and a.b stays accurate near 0 and 180 where acos loses digits.
  return (Math.atan2(norm(cross(a, b)), dot(a, b)) * 180) / Math.PI;
}

/** Determinant of a 3x3 matrix. */
export function det3(m: Mat3): number {
  return m[0] * (m[4] * m[8] - m[5] * m[7]) - m[1] * (m[3] * m[8] - m[5] * m[6]) + m[2] * (m[3] * m[7] - m[4] * m[6]);
}

/** Solves M x = b by Cramer's rule; null when |det| <= minDet. */
export function solve3(m: Mat3, b: Vec3, minDet = 0): Vec3 | null {
  const d = det3(m);
  if (!(Math.abs(d) > minDet)) return null;
  const c00 = m[4] * m[8] - m[5] * m[7];
  const c01 = m[5] * m[6] - m[3] * m[8];
  const c02 = m[3] * m[7] - m[4] * m[6];
  const c10 = m[2] * m[7] - m[1] * m[8];
  const c11 = m[0] * m[8] - m[2] * m[6];
  const c12 = m[1] * m[6] - m[0] * m[7];
  const c20 = m[1] * m[5] - m[2] * m[4];
  const c21 = m[2] * m[3] - m[0] * m[5];
  const c22 = m[0] * m[4] - m[1] * m[3];
  // x = adj(M) b / det, adj = cofactor matrix transposed.
  return {
    x: (c00 * b.x + c10 * b.y + c20 * b.z) / d,
    y: (c01 * b.x + c11 * b.y + c21 * b.z) / d,
    z: (c02 * b.x + c12 * b.y + c22 * b.z) / d,
  };
}

/** Inverse of a 3x3 matrix; null when |det| <= minDet. */
export function inverse3(m: Mat3, minDet = 0): Mat3 | null {
  const d = det3(m);
  if (!(Math.abs(d) > minDet)) return null;
  const inv = 1 / d;
  return [
    (m[4] * m[8] - m[5] * m[7]) * inv,
    (m[2] * m[7] - m[1] * m[8]) * inv,
    (m[1] * m[5] - m[2] * m[4]) * inv,
    (m[5] * m[6] - m[3] * m[8]) * inv,
    (m[0] * m[8] - m[2] * m[6]) * inv,
    (m[2] * m[3] - m[0] * m[5]) * inv,
    (m[3] * m[7] - m[4] * m[6]) * inv,
    (m[1] * m[6] - m[0] * m[7]) * inv,
    (m[0] * m[4] - m[1] * m[3]) * inv,
  ];
}

/** Matrix whose columns are a, b, c. */
export function columns3(a: Vec3, b: Vec3, c: Vec3): Mat3 {
  return [a.x, b.x, c.x, a.y, b.y, c.y, a.z, b.z, c.z];
}

/** A unit vector perpendicular to v, chosen deterministically (+z when v is zero). */
export function perpendicular(v: Vec3): Vec3 {
  const seed = Math.abs(v.x) < 0.9 ? { x: 1, y: 0, z: 0 } : { x: 0, y: 1, z: 0 };
  const s = dot(seed, v);
  return normalize({ x: seed.x - v.x * s, y: seed.y - v.y * s, z: seed.z - v.z * s }) ?? { x: 0, y: 0, z: 1 };
}
