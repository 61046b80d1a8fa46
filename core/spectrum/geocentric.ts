/**
 * Geodetic latitude, longitude and height on the WGS84 ellipsoid (a = 6 378 137 m,
 * 1/f = 298.257223563; NIMA TR8350.2) from geocentric Cartesian coordinates, as FITS headers
 * give a site in OBSGEO-X/Y/Z (ITRS, metres; Rots et al. 2015, A&A 574, A36, §4.1.1.3).
 * The latitude is found by the usual fixed-point iteration φ = atan2(z, p·(1 − e²·N/(N + h)))
 * (e.g. Hofmann-Wellenhof, Lichtenegger & Wasle, GNSS, 2008, §10.2.1), which reaches 1e-12 rad
 * at a few kilometres from the Earth's surface in a handful of steps.
 */
const A = 6378137;
const F = 1 / 298.257223563;
const E2 = F * (2 - F);

export interface Geodetic {
  latitudeDeg: number;
  /** East-positive, (−180°, 180°]. */
  longitudeDeg: number;
  heightM: number;
}

export function geodeticFromGeocentric(x: number, y: number, z: number): Geodetic {
  const p = Math.hypot(x, y);
  const deg = 180 / Math.PI;
  if (p < 1e-3) return { latitudeDeg: z >= 0 ? 90 : -90, longitudeDeg: 0, heightM: Math.abs(z) - A * (1 - F) };
  let lat = Math.atan2(z, p * (1 - E2));
  let h = 0;
  for (let i = 0; i < 10; i++) {
    const s = Math.sin(lat);
    const n = A / Math.sqrt(1 - E2 * s * s);
    h = p / Math.cos(lat) - n;
    const next = Math.atan2(z, p * (1 - (E2 * n) / (n + h)));
    const done = Math.abs(next - lat) < 1e-14;
    lat = next;
    if (done) break;
  }
  const s = Math.sin(lat);
  h = p / Math.cos(lat) - A / Math.sqrt(1 - E2 * s * s);
  return { latitudeDeg: lat * deg, longitudeDeg: Math.atan2(y, x) * deg, heightM: h };
}
