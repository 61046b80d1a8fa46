// Renders packaging/icon.svg (the app icon, original artwork) to the PNG sizes electron-builder
// uses, with Debian's Chromium: packaging/icon.png (1024 px) and packaging/icons/NxN.png.
import { mkdirSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { chromium } from 'playwright-core';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const svg = readFileSync(join(root, 'packaging', 'icon.svg'), 'utf8');
const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: ['--no-sandbox', '--disable-gpu'] });
const page = await browser.newPage();
mkdirSync(join(root, 'packaging', 'icons'), { recursive: true });
for (const size of [16, 32, 48, 64, 128, 256, 512, 1024]) {
  await page.setViewportSize({ width: size, height: size });
  await page.setContent(`<html><body style="margin:0;background:transparent">${svg.replace('<svg ', `<svg style="display:block;width:${size}px;height:${size}px" `)}</body></html>`);
  const out = size === 1024 ? join(root, 'packaging', 'icon.png') : join(root, 'packaging', 'icons', `${size}x${size}.png`);
  await page.screenshot({ path: out, omitBackground: true });
}
await browser.close();
