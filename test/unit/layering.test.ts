// The layering rule of DESIGN.md: core (outside core/node) is pure (no Node built-ins, no DOM);
// the renderer never reaches into core/node or electron. A wrong arrow fails here.
import { describe, expect, it } from 'vitest';
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { builtinModules } from 'node:module';
import { join, relative, resolve, dirname } from 'node:path';

const root = resolve(__dirname, '../..');

function sourceFiles(dir: string): string[] {
  const out: string[] = [];
  for (const name of readdirSync(dir)) {
    const p = join(dir, name);
    if (statSync(p).isDirectory()) out.push(...sourceFiles(p));
    else if (/\.(ts|mts|js|mjs)$/.test(name)) out.push(p);
  }
  return out;
}

export function importsOf(source: string): string[] {
  const specs: string[] = [];
  const re = /(?:import|export)\s[^'"`;]*?from\s*['"]([^'"]+)['"]|import\s*\(\s*['"]([^'"]+)['"]\s*\)|import\s+['"]([^'"]+)['"]|require\s*\(\s*['"]([^'"]+)['"]\s*\)/g;
  for (const m of source.matchAll(re)) specs.push(m[1] ?? m[2] ?? m[3] ?? m[4]);
  return specs;
}

const nodeBuiltins = new Set(builtinModules.flatMap((m) => [m, `node:${m}`]));
const domGlobals = /\b(window|document|navigator|localStorage|sessionStorage|HTMLElement|XMLHttpRequest|FileReader)\s*[.([]/;
const nodeGlobals = /\b(process|Buffer|__dirname|__filename)\s*[.([]/;

function stripComments(src: string): string {
  return src.replace(/\/\*[\s\S]*?\*\//g, '').replace(/(^|[^:'"`])\/\/.*$/gm, '$1');
}

describe('layering', () => {
  const pureCore = sourceFiles(join(root, 'core')).filter((f) => !relative(root, f).startsWith(join('core', 'node')));

  it('finds the pure core files', () => {
    expect(pureCore.length).toBeGreaterThan(0);
  });

  it('the import scanner sees every import form', () => {
    const sample = `import a from 'node:fs';\nimport { b } from "./b.js";\nimport 'side';\nconst c = await import('os');\nexport * from './d.js';`;
    expect(importsOf(sample)).toEqual(['node:fs', './b.js', 'side', 'os', './d.js']);
  });

  it.each(pureCore.map((f) => [relative(root, f), f]))('%s imports no Node built-in and uses no DOM or Node global', (_rel, file) => {
    const src = stripComments(readFileSync(file, 'utf8'));
    for (const spec of importsOf(src)) {
      expect(nodeBuiltins.has(spec), `imports ${spec}`).toBe(false);
      if (spec.startsWith('.')) {
        const target = resolve(dirname(file), spec);
        expect(relative(root, target).startsWith(join('core', 'node')), `imports ${spec}`).toBe(false);
        expect(relative(root, target).startsWith('renderer') || relative(root, target).startsWith('electron'), `imports ${spec}`).toBe(false);
      }
    }
    expect(domGlobals.test(src), 'uses a DOM global').toBe(false);
    expect(nodeGlobals.test(src), 'uses a Node global').toBe(false);
  });

  const rendererFiles = sourceFiles(join(root, 'renderer'));
  it.each(rendererFiles.map((f) => [relative(root, f), f]))('%s does not import core/node or electron', (_rel, file) => {
    const src = stripComments(readFileSync(file, 'utf8'));
    for (const spec of importsOf(src)) {
      expect(nodeBuiltins.has(spec), `imports ${spec}`).toBe(false);
      if (spec.startsWith('.')) {
        const target = relative(root, resolve(dirname(file), spec));
        expect(target.startsWith(join('core', 'node')) || target.startsWith('electron'), `imports ${spec}`).toBe(false);
      }
    }
  });
});
