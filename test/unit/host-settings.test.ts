// The settings store: where it lives (XDG Base Directory Specification: $XDG_CONFIG_HOME,
// default ~/.config), its defaults, atomic writes and a damaged file set aside.
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { homedir, tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { HostFailure } from '../../core/node/host/host-failure';
import { configDir, SETTINGS_FILE, SettingsStore } from '../../core/node/host/settings-store';
import { SITE } from '../../sample-spectra/demo/night';

let dir: string;
beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'zvet-settings-'));
});
afterEach(() => rmSync(dir, { recursive: true, force: true }));

describe('settings store', () => {
  it('lives in ZVET_CONFIG_DIR, else $XDG_CONFIG_HOME/zvet, else ~/.config/zvet', () => {
    expect(configDir({ ZVET_CONFIG_DIR: '/x/cfg', XDG_CONFIG_HOME: '/y' })).toBe('/x/cfg');
    expect(configDir({ XDG_CONFIG_HOME: '/y' })).toBe(join('/y', 'zvet'));
    expect(configDir({})).toBe(join(homedir(), '.config', 'zvet'));
  });

  it('defaults to the demo night site, Planck 2018 and the OS user, without writing anything', async () => {
    const s = await new SettingsStore(dir).get();
    expect(s.sites).toEqual([{ name: SITE.name, latitudeDeg: SITE.latitudeDeg, longitudeDeg: SITE.longitudeDeg, heightM: SITE.heightM }]);
    expect(s.cosmologyPreset).toBe('planck18');
    expect(s.user.length).toBeGreaterThan(0);
    expect(readdirSync(dir)).toEqual([]);
  });

  it('writes JSON that a new store reads back, leaving no temporary file behind', async () => {
    const a = new SettingsStore(join(dir, 'nested'));
    await a.put({ user: 'observer-2', cosmologyPreset: 'custom', customCosmology: { h0: 73, omegaM: 0.3, omegaL: 0.7 } });
    const b = await new SettingsStore(join(dir, 'nested')).get();
    expect(b).toMatchObject({ user: 'observer-2', cosmologyPreset: 'custom', customCosmology: { h0: 73, omegaM: 0.3, omegaL: 0.7 } });
    expect(JSON.parse(readFileSync(join(dir, 'nested', SETTINGS_FILE), 'utf8')).user).toBe('observer-2');
    expect(readdirSync(join(dir, 'nested'))).toEqual([SETTINGS_FILE]);
  });

  it('keeps the recent worklists newest first, without repeats', async () => {
    const s = new SettingsStore(dir);
    for (const p of ['/n/1', '/n/2', '/n/1', '/n/3']) await s.rememberWorklist(p);
    expect((await s.get()).recentWorklists).toEqual(['/n/3', '/n/1', '/n/2']);
  });

  it('refuses an unknown cosmology preset, and custom without its values', async () => {
    const s = new SettingsStore(dir);
    await expect(s.put({ cosmologyPreset: 'wmap-nine' })).rejects.toBeInstanceOf(HostFailure);
    await expect(s.put({ cosmologyPreset: 'custom' })).rejects.toThrow(/needs customCosmology/);
    expect(existsSync(join(dir, SETTINGS_FILE))).toBe(false);
  });

  it('sets a damaged file aside with a warning and starts from the defaults', async () => {
    writeFileSync(join(dir, SETTINGS_FILE), '{"user": "half');
    const s = new SettingsStore(dir);
    expect((await s.get()).cosmologyPreset).toBe('planck18');
    expect(s.warnings[0]).toMatch(/could not be read/);
    const aside = readdirSync(dir).filter((f) => f.includes('damaged'));
    expect(aside).toHaveLength(1);
    expect(readFileSync(join(dir, aside[0]), 'utf8')).toBe('{"user": "half');
  });
});
