/**
 * The IAU Galactic coordinate system on the ICRS, as defined for the Hipparcos catalogue
 * (ESA 1997, The Hipparcos and Tycho Catalogues, vol. 1, §1.5.3): north Galactic pole at
 * α = 192.85948°, δ = +27.12825° (ICRS), and the ascending node of the Galactic plane on the
 * equator at Galactic longitude l_Ω = 32.93192°.
 */
import { dot, lonLatDeg, unitVector, type Vec3 } from './coords.js';

const NGP_RA_DEG = 192.85948;
const NGP_DEC_DEG = 27.12825;
const NODE_LONGITUDE_DEG = 32.93192;

function cross(a: Vec3, b: Vec3): Vec3 {
  return [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
}

/** Rows: the Galactic x (toward l = 0, b = 0), y (l = 90°) and z (north pole) axes in ICRS. */
function galacticAxes(): readonly [Vec3, Vec3, Vec3] {
  const z = unitVector(NGP_RA_DEG, NGP_DEC_DEG);
  const node = unitVector(NGP_RA_DEG + 90, 0);
  const inPlane = cross(z, node);
  const l = (NODE_LONGITUDE_DEG * Math.PI) / 180;
  const x: Vec3 = [
    Math.cos(l) * node[0] - Math.sin(l) * inPlane[0],
    Math.cos(l) * node[1] - Math.sin(l) * inPlane[1],
    Math.cos(l) * node[2] - Math.sin(l) * inPlane[2],
  ];
  return [x, cross(z, x), z];
}

/** The ICRS → Galactic rotation matrix: Galactic = M · ICRS (Hipparcos vol. 1 §1.5.3). */
export const ICRS_TO_GALACTIC: readonly [Vec3, Vec3, Vec3] = galacticAxes();

/** Galactic longitude and latitude, degrees, of an ICRS direction. */
export function galacticFromIcrs(raDeg: number, decDeg: number): { lDeg: number; bDeg: number } {
  const v = unitVector(raDeg, decDeg);
  const g: Vec3 = [dot(ICRS_TO_GALACTIC[0], v), dot(ICRS_TO_GALACTIC[1], v), dot(ICRS_TO_GALACTIC[2], v)];
  const { lonDeg, latDeg } = lonLatDeg(g);
  return { lDeg: lonDeg, bDeg: latDeg };
}

/** ICRS unit vector of a Galactic direction given in degrees. */
export function icrsVectorFromGalactic(lDeg: number, bDeg: number): Vec3 {
  const g = unitVector(lDeg, bDeg);
  const [x, y, z] = ICRS_TO_GALACTIC;
  return [
    x[0] * g[0] + y[0] * g[1] + z[0] * g[2],
    x[1] * g[0] + y[1] * g[1] + z[1] * g[2],
    x[2] * g[0] + y[2] * g[1] + z[2] * g[2],
  ];
}
