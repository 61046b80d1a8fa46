// Offline guarantee, checked on the built window itself (dist/renderer/), beside the end-to-end
// test that records every request the page makes: the page, its stylesheet and zvet's own script
// name nothing outside the app, and every web address left in the bundled plotly.js is one the
// page never loads, named below with the reason. A new address (a plotly upgrade, a new
// dependency) fails this test until someone has looked at it.
// Comments are told from code by letting esbuild drop all comments (legalComments: 'none'):
// an address that disappears was in a comment or licence text.
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { transformSync } from 'esbuild';
import { describe, expect, it } from 'vitest';
import { CONTENT_SECURITY_POLICY } from '../../core/node/host/security-headers';
import { ROOT } from '../support/paths';

const RENDERER = join(ROOT, 'dist/renderer');
const URL_PATTERN = /\b(?:https?|wss?):\/\/[^\s"'`<>()\\]+/g;
const LOOPBACK = /^(?:https?|wss?):\/\/(?:127\.0\.0\.1|localhost|\[::1\])(?::\d+)?(?:\/|$)/;

/** Addresses in comments and licence texts of plotly.min.js (documentation, never loaded). */
const PLOTLY_COMMENT_URLS = [
  'http://getify.mit-license.org', // licence header of a bundled module
  'http://syntheti.cc', // author link in a bundled module's licence header
  'https://github.com/voidqk/polybooljs', // licence header of polybooljs
];

/**
 * Addresses in plotly.min.js (plotly's basic partial bundle) code, each with the reason the zvet
 * page never loads it. The geo one is fetched only by geo traces, which zvet never draws (checked
 * below); the content security policy would block every one of them anyway (checked below too).
 */
const PLOTLY_CODE_URLS: Record<string, string> = {
  // XML namespace names: identifiers, not addresses to fetch (Namespaces in XML 1.0, §2.2; from memory).
  'http://www.w3.org/2000/svg': 'XML namespace name',
  'http://www.w3.org/1999/xlink': 'XML namespace name',
  'http://www.w3.org/1999/xhtml': 'XML namespace name',
  'http://www.w3.org/2000/xmlns/': 'XML namespace name',
  'http://www.w3.org/XML/1998/namespace': 'XML namespace name',
  // Geo traces (scattergeo, choropleth): country outlines; not in the basic bundle's trace set.
  'https://cdn.plot.ly/un/': 'geo-trace country outlines (topojson)',
  // Chart Studio export: only with the showSendToCloud / showEditInChartStudio options (not set).
  'https://cloud.plotly.com/newchart': 'Chart Studio export, off unless configured',
  // Texts and links shown to a person, never fetched by the page.
  'https://plotly.com/': 'logo link of the mode bar, hidden (displaylogo: false)',
  'https://plotly.com/javascript/animations/': 'text of a console warning',
  'https://github.com/d3/d3-format/tree/v1.4.5#d3-format': 'text of a format error message',
  'https://github.com/d3/d3-time-format/tree/v2.2.3#locale_format': 'text of a format error message',
};

/** The plotly trace types that fetch remote map or geo data. */
const REMOTE_DATA_TRACES = ['scattermap', 'scattermapbox', 'choroplethmap', 'choroplethmapbox', 'densitymap', 'densitymapbox', 'scattergeo', 'choropleth'];

function urls(text: string): string[] {
  return text.match(URL_PATTERN) ?? [];
}

function withoutComments(text: string, loader: 'js' | 'css'): string {
  return transformSync(text, { loader, legalComments: 'none', minifyWhitespace: true }).code;
}

function read(name: string): string {
  const path = join(RENDERER, name);
  if (!existsSync(path)) throw new Error(`${path} is missing: run npm run build first`);
  return readFileSync(path, 'utf8');
}

/** Built files of the window with this ending. */
function builtFiles(ending: string): string[] {
  return readdirSync(RENDERER).filter((f) => f.endsWith(ending)).sort();
}

/** Every .ts file of the renderer's source. */
function rendererSources(): string[] {
  const out: string[] = [];
  const walk = (dir: string) => {
    for (const e of readdirSync(dir, { withFileTypes: true })) {
      if (e.isDirectory()) walk(join(dir, e.name));
      else if (e.name.endsWith('.ts')) out.push(join(dir, e.name));
    }
  };
  walk(join(ROOT, 'renderer'));
  return out;
}

describe('offline: the built window names nothing outside the app', () => {
  it('dist/renderer holds only the page, scripts, stylesheets, fonts and images (and source maps)', () => {
    const files = readdirSync(RENDERER).filter((f) => !f.endsWith('.map'));
    for (const f of files) expect(f).toMatch(/\.(html|js|css|woff2|svg|png|ico)$/);
    expect(files).toEqual(expect.arrayContaining(['index.html', 'app.js', 'app.css', 'plotly.min.js']));
  });

  it('index.html refers only to files beside it, and holds no web address', () => {
    const html = read('index.html');
    expect(urls(html)).toEqual([]);
    expect(html).not.toMatch(/<base\b|http-equiv\s*=\s*["']?refresh|url\s*\(|@import|<iframe|<object|<embed/i);
    const refs = [...html.matchAll(/\b(src|href|srcset|action|formaction|poster|data|manifest)\s*=\s*["']([^"']*)["']/gi)].map((m) => m[2]);
    expect(refs.length).toBeGreaterThanOrEqual(3);
    for (const ref of refs) {
      expect(ref, ref).toMatch(/^[\w.-]+$/); // no scheme, no //host, no absolute path
      expect(existsSync(join(RENDERER, ref)), ref).toBe(true);
    }
  });

  it('the stylesheets load nothing: no web address, no @import, url() only to data: or files beside them', () => {
    for (const name of builtFiles('.css')) {
      const css = read(name);
      expect(urls(css), name).toEqual([]);
      expect(css, name).not.toMatch(/@import/i);
      for (const m of css.matchAll(/url\(\s*["']?([^"')]*)/gi)) {
        expect(m[1], `${name}: ${m[1]}`).toMatch(/^(data:|[\w.-]+$)/);
        if (!m[1].startsWith('data:')) expect(existsSync(join(RENDERER, m[1])), `${name}: ${m[1]}`).toBe(true);
      }
    }
  });

  it("zvet's own scripts: no web address at all, and the only network calls are to its own /api/ and plotly.min.js", () => {
    const own = builtFiles('.js').filter((f) => f !== 'plotly.min.js');
    expect(own).toContain('app.js');
    const fetched: string[] = [];
    const loaded: string[] = [];
    for (const name of own) {
      const js = read(name);
      expect(urls(js).filter((u) => !LOOPBACK.test(u)), name).toEqual([]);
      const code = withoutComments(js, 'js');
      fetched.push(...[...code.matchAll(/(?<![\w.])fetch\(\s*([^,)]*)/g)].map((m) => m[1]));
      loaded.push(...[...code.matchAll(/\.(?:src|href)\s*=(?!=)\s*([^;,]*)/g)].map((m) => m[1]));
      expect(code, name).not.toMatch(/\b(?:WebSocket|EventSource|XMLHttpRequest|sendBeacon|importScripts|SharedWorker)\b|new Worker\b|\bimport\(/);
    }
    expect(fetched).toEqual(['`/api/${method}`']);
    expect(loaded).toEqual(['"plotly.min.js"']);
  });

  it('plotly.min.js: addresses in comments are documentation or licence texts, each named', () => {
    const js = read('plotly.min.js');
    const inCode = new Set(urls(withoutComments(js, 'js')));
    const commentOnly = [...new Set(urls(js))].filter((u) => !inCode.has(u)).sort();
    expect(commentOnly).toEqual([...PLOTLY_COMMENT_URLS].sort());
  });

  it('plotly.min.js: every address in code is one the page never loads, each named with its reason', () => {
    const inCode = [...new Set(urls(withoutComments(read('plotly.min.js'), 'js')))].filter((u) => !LOOPBACK.test(u)).sort();
    const unexplained = inCode.filter((u) => !(u in PLOTLY_CODE_URLS));
    const gone = Object.keys(PLOTLY_CODE_URLS).filter((u) => !inCode.includes(u));
    expect(unexplained, 'addresses nobody has looked at').toEqual([]);
    expect(gone, 'listed addresses no longer in the bundle: drop them from the list').toEqual([]);
    console.log(`offline: plotly.min.js holds ${inCode.length} addresses in code, all named; ${PLOTLY_COMMENT_URLS.length} in comments`);
  });

  it('the window draws no trace that fetches map or geo data, and turns on no plotly cloud option', () => {
    for (const file of rendererSources()) {
      const text = readFileSync(file, 'utf8');
      for (const trace of REMOTE_DATA_TRACES) expect(text, `${file} uses ${trace}`).not.toMatch(new RegExp(`['"]${trace}['"]`));
      expect(text, file).not.toMatch(/showSendToCloud|showEditInChartStudio|plotlyServerURL|topojsonURL|mapboxAccessToken|showLink\s*:\s*true/);
    }
    const config = readFileSync(join(ROOT, 'renderer/plot/plotly.ts'), 'utf8');
    expect(config).toMatch(/displaylogo:\s*false/);
  });

  it('and the content security policy would refuse any other origin for every kind of load', () => {
    const directives = new Map(CONTENT_SECURITY_POLICY.split(';').map((d) => d.trim().split(/\s+/)).map(([name, ...sources]) => [name, sources]));
    expect(directives.get('default-src')).toEqual(["'self'"]);
    for (const [name, sources] of directives) {
      for (const s of sources) expect(`${name} ${s}`).toMatch(/ ('self'|'none'|'unsafe-inline'|data:|blob:)$/);
    }
    expect(directives.get('form-action')).toEqual(["'none'"]);
    expect(directives.get('connect-src')).toEqual(["'self'"]);
  });
});
