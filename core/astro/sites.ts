/**
 * Observing sites the barycentric correction can use by name. Users add their own in the
 * settings. Geodetic WGS 84 latitude, east-positive longitude, height above the ellipsoid.
 * A site 1 km off moves a barycentric correction by less than 0.1 m/s.
 */
import type { Site } from '../spectrum/spectrum.js';

export interface KnownSite {
  /** Short lower-case key for --site and the settings. */
  id: string;
  name: string;
  latitudeDeg: number;
  /** East-positive longitude. */
  longitudeDeg: number;
  heightM: number;
  /** Where the coordinates come from. */
  source: string;
}

const FROM_MEMORY = 'published observatory coordinates, from memory (to about 1 km)';

export const SITES: readonly KnownSite[] = [
  {
    id: 'kestrel-ridge',
    name: 'Kestrel Ridge',
    latitudeDeg: 36.1843,
    longitudeDeg: -105.721,
    heightM: 2840,
    source: 'invented for the demo (fictional 2.4 m telescope); not a real observatory',
  },
  { id: 'greenwich', name: 'Royal Observatory Greenwich', latitudeDeg: 51.477811, longitudeDeg: -0.001475, heightM: 46, source: 'Ordnance Survey, as in the site list bundled with astropy' },
  { id: 'paranal', name: 'Cerro Paranal (ESO)', latitudeDeg: -24.6272, longitudeDeg: -70.4042, heightM: 2635, source: FROM_MEMORY },
  { id: 'la-silla', name: 'La Silla (ESO)', latitudeDeg: -29.2563, longitudeDeg: -70.738, heightM: 2400, source: FROM_MEMORY },
  { id: 'mauna-kea', name: 'Maunakea', latitudeDeg: 19.8207, longitudeDeg: -155.4681, heightM: 4205, source: FROM_MEMORY },
  { id: 'kitt-peak', name: 'Kitt Peak', latitudeDeg: 31.9583, longitudeDeg: -111.5967, heightM: 2096, source: FROM_MEMORY },
  { id: 'roque', name: 'Roque de los Muchachos', latitudeDeg: 28.7606, longitudeDeg: -17.8816, heightM: 2326, source: FROM_MEMORY },
  { id: 'siding-spring', name: 'Siding Spring', latitudeDeg: -31.2733, longitudeDeg: 149.0617, heightM: 1165, source: FROM_MEMORY },
];

/** The site whose id or name matches (case and spacing ignored), or undefined. */
export function findSite(nameOrId: string, sites: readonly KnownSite[] = SITES): KnownSite | undefined {
  const key = nameOrId.trim().toLowerCase().replace(/[\s_]+/g, '-');
  return sites.find((s) => s.id === key || s.name.toLowerCase().replace(/[\s_]+/g, '-') === key);
}

/** Throws a RangeError when the site's coordinates are missing or impossible. */
export function checkSite(site: { latitudeDeg: number; longitudeDeg: number; heightM: number }): void {
  if (!(site.latitudeDeg >= -90 && site.latitudeDeg <= 90)) throw new RangeError(`site latitude ${site.latitudeDeg}° is outside −90…+90°`);
  if (!(site.longitudeDeg >= -360 && site.longitudeDeg <= 360)) throw new RangeError(`site longitude ${site.longitudeDeg}° is outside −360…+360°`);
  if (!(site.heightM > -1000 && site.heightM < 10000)) throw new RangeError(`site height ${site.heightM} m is not on the Earth's surface`);
}

/** A site with all three coordinates, as the barycentric correction needs. */
export type ResolvedSite = Required<Site>;

/**
 * Completes a site as given by a header: its own coordinates when it has latitude and
 * longitude (height 0 m when absent, stated in `note`), else the known site of that name.
 * Null when neither works.
 */
export function resolveSite(site: Site | undefined, sites: readonly KnownSite[] = SITES): { site: ResolvedSite; note: string } | null {
  if (!site) return null;
  if (Number.isFinite(site.latitudeDeg) && Number.isFinite(site.longitudeDeg)) {
    const heightKnown = Number.isFinite(site.heightM);
    return {
      site: { name: site.name ?? 'site from the header', latitudeDeg: site.latitudeDeg!, longitudeDeg: site.longitudeDeg!, heightM: heightKnown ? site.heightM! : 0 },
      note: heightKnown ? 'coordinates given' : 'coordinates given, height unknown so 0 m used',
    };
  }
  const known = site.name ? findSite(site.name, sites) : undefined;
  if (!known) return null;
  return {
    site: { name: known.name, latitudeDeg: known.latitudeDeg, longitudeDeg: known.longitudeDeg, heightM: known.heightM },
    note: `coordinates of the known site "${known.name}"`,
  };
}
