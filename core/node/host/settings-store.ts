/**
 * The user's settings (recent worklists, sites, cosmology preset, user name) as one JSON file in
 * the user's config folder: $ZVET_CONFIG_DIR (tests), else $XDG_CONFIG_HOME/zvet, else
 * ~/.config/zvet. Written atomically; a damaged file is set aside with a warning, never lost.
 */
import { mkdir, readFile, rename } from 'node:fs/promises';
import { homedir, userInfo } from 'node:os';
import { dirname, join } from 'node:path';
import type { Settings, SiteSetting } from '../../api/host-api.js';
import { COSMOLOGY_PRESETS } from '../../astro/cosmology.js';
import { findSite } from '../../astro/sites.js';
import { writeFileAtomic } from '../atomic-write.js';
import { HostFailure } from './host-failure.js';

export const SETTINGS_FILE = 'settings.json';
const MAX_RECENT = 12;

/** The demo night's telescope, from the known-site list. */
function demoSite(): SiteSetting {
  const { name, latitudeDeg, longitudeDeg, heightM } = findSite('kestrel-ridge')!;
  return { name, latitudeDeg, longitudeDeg, heightM };
}

export function configDir(env: NodeJS.ProcessEnv = process.env): string {
  if (env.ZVET_CONFIG_DIR) return env.ZVET_CONFIG_DIR;
  const base = env.XDG_CONFIG_HOME || join(homedir(), '.config');
  return join(base, 'zvet');
}

function osUserName(): string {
  try {
    return userInfo().username || 'observer';
  } catch {
    return process.env.USER || process.env.USERNAME || 'observer';
  }
}

export function defaultSettings(): Settings {
  return {
    recentWorklists: [],
    sites: [demoSite()],
    cosmologyPreset: 'planck18',
    customCosmology: null,
    user: osUserName(),
  };
}

/** Refuses a preset that does not exist, or 'custom' without its values. */
function checkCosmology(s: Settings): void {
  if (s.cosmologyPreset === 'custom') {
    if (!s.customCosmology) throw new HostFailure(400, 'cosmologyPreset "custom" needs customCosmology { h0, omegaM, omegaL }');
  } else if (!Object.hasOwn(COSMOLOGY_PRESETS, s.cosmologyPreset)) {
    throw new HostFailure(400, `cosmologyPreset: unknown preset "${s.cosmologyPreset}" (known: ${[...Object.keys(COSMOLOGY_PRESETS), 'custom'].join(', ')})`);
  }
}

export class SettingsStore {
  readonly file: string;
  private settings: Settings | null = null;
  /** Problems met while reading the file, to show once. */
  readonly warnings: string[] = [];

  constructor(dir: string = configDir()) {
    this.file = join(dir, SETTINGS_FILE);
  }

  async get(): Promise<Settings> {
    if (!this.settings) this.settings = await this.load();
    return structuredClone(this.settings);
  }

  private async load(): Promise<Settings> {
    let text: string;
    try {
      text = await readFile(this.file, 'utf8');
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code === 'ENOENT') return defaultSettings();
      throw err;
    }
    try {
      const parsed = JSON.parse(text) as Partial<Settings>;
      if (typeof parsed !== 'object' || parsed === null || Array.isArray(parsed)) throw new Error('not a JSON object');
      const merged = { ...defaultSettings(), ...parsed };
      checkCosmology(merged);
      return merged;
    } catch (err) {
      const aside = `${this.file}.damaged-${Date.now()}`;
      await rename(this.file, aside);
      this.warnings.push(`${this.file}: could not be read (${(err as Error).message}); set aside as ${aside}, using defaults`);
      return defaultSettings();
    }
  }

  /** Applies a partial update (already shape-checked) and writes the file. */
  async put(patch: Partial<Settings>): Promise<Settings> {
    const next: Settings = { ...(await this.get()), ...patch };
    checkCosmology(next);
    next.recentWorklists = [...new Set(next.recentWorklists)].slice(0, MAX_RECENT);
    await mkdir(dirname(this.file), { recursive: true });
    await writeFileAtomic(this.file, `${JSON.stringify(next, null, 2)}\n`);
    this.settings = next;
    return structuredClone(next);
  }

  /** Puts a worklist at the head of the recent list. */
  async rememberWorklist(path: string): Promise<void> {
    const current = await this.get();
    await this.put({ recentWorklists: [path, ...current.recentWorklists.filter((p) => p !== path)] });
  }
}
