/**
 * Barycentric and heliocentric radial-velocity corrections for an observer on the Earth.
 * The Earth's barycentric state, the Sun's and the observer's geocentric state come from
 * astronomy-engine; the barycentric correction is the relativistic form of Wright & Eastman
 * (2014, PASP 126, 838) eq. 28 without the Shapiro delay and the target's own motion — the
 * form astropy's SkyCoord.radial_velocity_correction('barycentric') uses — and the
 * heliocentric one the plain projection v·n̂, as astropy does for 'heliocentric'.
 * Sign convention (astropy's): add the correction to the measured velocity, or exactly,
 * (1 + z_bary) = (1 + z_obs)(1 + v_corr/c).
 */
import { AstroTime, BaryState, Body, Observer, ObserverState, type StateVector } from 'astronomy-engine';
import { KM_PER_AU, SPEED_OF_LIGHT_KMS } from './constants.js';
import { dot, unitVector, type Vec3 } from './coords.js';
import { checkSite } from './sites.js';
import { MJD_J2000, mjdTdbFromUtc, mjdTtFromUtc, taiMinusUtcS } from './time.js';

export interface BarycentricInput {
  /** ICRS right ascension and declination of the target, degrees. */
  raDeg: number;
  decDeg: number;
  /** Time of the observation (mid-exposure), UTC, as MJD. */
  mjdUtc: number;
  site: { name?: string; latitudeDeg: number; longitudeDeg: number; heightM: number };
}

export interface BarycentricCorrection {
  /** Barycentric correction, km/s, to add to the measured velocity (W&E 2014 eq. 28). */
  vCorrKmS: number;
  /** Heliocentric correction v·n̂, km/s, same sign convention. */
  vHelioKmS: number;
  /** The gravitational-redshift and time-dilation part of vCorrKmS, km/s (a few m/s). */
  relativisticKmS: number;
  mjdUtc: number;
  mjdTt: number;
  mjdTdb: number;
  taiMinusUtcS: number;
}

/**
 * Gravitational parameters GM, km³/s². Sun, Earth, Jupiter: IAU 2015 Resolution B3 nominal
 * values. Moon, Saturn, Uranus, Neptune: JPL DE430 values, from memory; each of these four adds
 * less than 0.1 mm/s to the correction.
 */
const GM_KM3_S2: ReadonlyArray<readonly [Body, number]> = [
  [Body.Sun, 1.3271244e11],
  [Body.Jupiter, 1.2668653e8],
  [Body.Saturn, 3.7931187e7],
  [Body.Uranus, 5.793939e6],
  [Body.Neptune, 6.836529e6],
  [Body.Moon, 4.902800e3],
];
const GM_EARTH_KM3_S2 = 3.986004e5;

const KM_S_PER_AU_DAY = KM_PER_AU / 86400;

/**
 * A time for astronomy-engine with UT1 = UTC for the Earth's rotation and the ephemeris
 * argument set from the leap-second table (TDB) instead of the library's own ΔT model.
 */
function engineTime(mjdUtc: number, mjdTdb: number): AstroTime {
  const time = new AstroTime(mjdUtc - MJD_J2000);
  time.tt = mjdTdb - MJD_J2000;
  return time;
}

function position(s: StateVector): Vec3 {
  return [s.x, s.y, s.z];
}

function velocityKmS(s: StateVector): Vec3 {
  return [s.vx * KM_S_PER_AU_DAY, s.vy * KM_S_PER_AU_DAY, s.vz * KM_S_PER_AU_DAY];
}

function distanceKm(a: Vec3, b: Vec3): number {
  return Math.hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2]) * KM_PER_AU;
}

/** Barycentric and heliocentric corrections for one target, time and site. */
export function barycentricCorrection(input: BarycentricInput): BarycentricCorrection {
  const { raDeg, decDeg, mjdUtc, site } = input;
  if (!(raDeg >= 0 && raDeg < 360)) throw new RangeError(`right ascension ${raDeg}° is outside 0–360°`);
  if (!(decDeg >= -90 && decDeg <= 90)) throw new RangeError(`declination ${decDeg}° is outside −90…+90°`);
  if (!Number.isFinite(mjdUtc)) throw new RangeError(`observation time MJD ${mjdUtc} is not a number`);
  checkSite(site);
  const mjdTt = mjdTtFromUtc(mjdUtc);
  const mjdTdb = mjdTdbFromUtc(mjdUtc);
  const time = engineTime(mjdUtc, mjdTdb);

  const earth = BaryState(Body.Earth, time);
  const sun = BaryState(Body.Sun, time);
  const observer = ObserverState(time, new Observer(site.latitudeDeg, site.longitudeDeg, site.heightM), false);

  const vEarth = velocityKmS(earth);
  const vObsGeo = velocityKmS(observer);
  const vSun = velocityKmS(sun);
  const target = unitVector(raDeg, decDeg);

  const vBary: Vec3 = [vEarth[0] + vObsGeo[0], vEarth[1] + vObsGeo[1], vEarth[2] + vObsGeo[2]];
  const vHelio: Vec3 = [vBary[0] - vSun[0], vBary[1] - vSun[1], vBary[2] - vSun[2]];

  // W&E 2014 eq. 28: 1 + z_B = γ (1 + β·n̂) / (1 + Φ/c²), Φ = −Σ GM/r at the observer.
  const c = SPEED_OF_LIGHT_KMS;
  const beta: Vec3 = [vBary[0] / c, vBary[1] / c, vBary[2] / c];
  const gamma = 1 / Math.sqrt(1 - dot(beta, beta));
  const obsPos: Vec3 = [earth.x + observer.x, earth.y + observer.y, earth.z + observer.z];
  let potentialOverC2 = -GM_EARTH_KM3_S2 / (Math.hypot(observer.x, observer.y, observer.z) * KM_PER_AU) / (c * c);
  for (const [body, gm] of GM_KM3_S2) {
    potentialOverC2 -= gm / distanceKm(position(BaryState(body, time)), obsPos) / (c * c);
  }
  const projection = dot(beta, target);
  const zB = (gamma * (1 + projection)) / (1 + potentialOverC2) - 1;
  const vCorrKmS = zB * c;

  return {
    vCorrKmS,
    vHelioKmS: dot(vHelio, target),
    relativisticKmS: vCorrKmS - projection * c,
    mjdUtc,
    mjdTt,
    mjdTdb,
    taiMinusUtcS: taiMinusUtcS(mjdUtc),
  };
}

/** (1 + z_corrected) = (1 + z_obs)(1 + v_corr/c): apply a velocity correction to a redshift. */
export function applyVelocityCorrection(zObs: number, vCorrKmS: number): number {
  return (1 + zObs) * (1 + vCorrKmS / SPEED_OF_LIGHT_KMS) - 1;
}
