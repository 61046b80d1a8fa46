// The desktop packaging config, checked by electron-builder's own configuration schema
// (app-builder-lib's validator, the one `electron-builder` runs before building), plus the
// icon files it names. Building the packages needs the network, so it is not done here.
import { createRequire } from 'node:module';
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { ROOT } from '../support/paths';

const require = createRequire(import.meta.url);

/** Width and height from a PNG's IHDR chunk (PNG spec, ISO/IEC 15948 §11.2.2). */
function pngSize(path: string): [number, number] {
  const b = readFileSync(path);
  expect(b.subarray(1, 4).toString('latin1')).toBe('PNG');
  return [b.readUInt32BE(16), b.readUInt32BE(20)];
}

describe('electron-builder configuration', () => {
  it('passes electron-builder’s schema and targets AppImage, deb, dmg and nsis', async () => {
    const { getConfig, validateConfiguration } = require(resolve(ROOT, 'node_modules/app-builder-lib/out/util/config/config.js'));
    const { DebugLogger } = require(resolve(ROOT, 'node_modules/builder-util'));
    const config = await getConfig(ROOT, null, null);
    await validateConfiguration(config, new DebugLogger(false));
    expect(config.linux.target).toEqual(['AppImage', 'deb']);
    expect(config.mac.target).toEqual(['dmg']);
    expect(config.win.target).toEqual(['nsis']);
    expect(config.extraMetadata.main).toBe('dist/electron/main.cjs');
    const files = config.files.flatMap((f: string | { filter: string[] }) => (typeof f === 'string' ? [f] : f.filter));
    for (const needed of ['dist/electron/**', 'dist/renderer/**', 'dist/*.js']) expect(files).toContain(needed);
  });

  it('has the icon at every size the platforms use, square', () => {
    expect(pngSize(resolve(ROOT, 'packaging/icon.png'))).toEqual([1024, 1024]);
    for (const n of [16, 32, 48, 64, 128, 256, 512]) expect(pngSize(resolve(ROOT, `packaging/icons/${n}x${n}.png`))).toEqual([n, n]);
  });

  it('is run by npm run dist after the build', () => {
    const pkg = JSON.parse(readFileSync(resolve(ROOT, 'package.json'), 'utf8'));
    expect(pkg.scripts.dist).toMatch(/scripts\/build\.mjs && electron-builder/);
    expect(pkg.main).toBe('dist/electron/main.cjs');
  });
});
