/**
 * Air ↔ vacuum wavelengths by the IAU standard: Edlén (1966) as adopted in Morton (1991,
 * ApJS 77, 119, eq. 3): (n − 1)·10⁸ = 6432.8 + 2 949 810/(146 − σ²) + 25 540/(41 − σ²),
 * σ the vacuum wavenumber in µm⁻¹. Valid above 2000 Å; below that wavelengths are vacuum by
 * convention and are returned unchanged.
 */

/** Shortest wavelength (Å) to which the air/vacuum conversion applies. */
export const AIR_VACUUM_MIN_ANGSTROM = 2000;

/** Refractive index of standard air at the given vacuum wavelength (Å). */
export function refractiveIndexAir(waveVacuumAngstrom: number): number {
  const sigma2 = (1e4 / waveVacuumAngstrom) ** 2;
  return 1 + (6432.8 + 2_949_810 / (146 - sigma2) + 25_540 / (41 - sigma2)) * 1e-8;
}

export function vacuumToAir(waveVacuumAngstrom: number): number {
  if (!(waveVacuumAngstrom >= AIR_VACUUM_MIN_ANGSTROM)) return waveVacuumAngstrom;
  return waveVacuumAngstrom / refractiveIndexAir(waveVacuumAngstrom);
}

/** Inverse of vacuumToAir, by fixed-point iteration (converges to < 1e-9 Å in 4 steps). */
export function airToVacuum(waveAirAngstrom: number): number {
  if (!(waveAirAngstrom >= AIR_VACUUM_MIN_ANGSTROM)) return waveAirAngstrom;
  let vac = waveAirAngstrom;
  for (let i = 0; i < 6; i++) vac = waveAirAngstrom * refractiveIndexAir(vac);
  return vac;
}
