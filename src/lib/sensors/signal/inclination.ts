/** A device axis by its W3C name. */
export type DeviceAxis = 'x' | 'y' | 'z';

const DEG = 180 / Math.PI;

/**
 * Angle (deg, 0–180) between a device axis and the upward vertical, from an accelerometer reading
 * at rest (which points up: a phone flat and screen-up reads (0, 0, +g)). Long edge (y) straight up:
 * 0°; level: 90°; pointing down: 180°. atan2 of the perpendicular and parallel parts rather than
 * acos, so angles near 0° and 180° keep full precision. Independent of the phone's roll about that
 * axis. NaN for a zero vector.
 */
export function axisAngleToVerticalDeg(x: number, y: number, z: number, axis: DeviceAxis = 'y'): number {
  const along = axis === 'x' ? x : axis === 'y' ? y : z;
  const across = axis === 'x' ? Math.hypot(y, z) : axis === 'y' ? Math.hypot(x, z) : Math.hypot(x, y);
  if (along === 0 && across === 0) return Number.NaN;
  return Math.atan2(across, along) * DEG;
}

/**
 * Angle (deg, 0–180) between two vectors, atan2(|a × b|, a · b), accurate at every angle. For two
 * gravity readings taken in the two positions of the two-position method, this is the rotation of
 * the segment between them whenever the rotation axis is horizontal, whatever the phone's
 * orientation on the segment. NaN when either vector is zero.
 */
export function angleBetweenDeg(ax: number, ay: number, az: number, bx: number, by: number, bz: number): number {
  const cx = ay * bz - az * by;
  const cy = az * bx - ax * bz;
  const cz = ax * by - ay * bx;
  const cross = Math.hypot(cx, cy, cz);
  const dotProduct = ax * bx + ay * by + az * bz;
  if (cross === 0 && dotProduct === 0) return Number.NaN;
  return Math.atan2(cross, dotProduct) * DEG;
}
