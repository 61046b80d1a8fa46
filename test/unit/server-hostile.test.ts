// Hostile requests against browser mode (`zvet serve`), sent raw to the real server process:
// each is refused with the right status, and the server keeps answering afterwards.
// The rules tested are the product's own (issue: token, Host/Origin against DNS rebinding,
// only worklist files readable); status codes follow RFC 9110 (403, 404, 405, 413, 414, 415).
import { cpSync, mkdirSync, mkdtempSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { DEMO_WORKLIST, ZVET_BIN } from '../support/paths';
import { call, rawRequest, request, startServe, type ServeProcess } from './server-harness';

const SECRET = 'outside-the-worklist-secret-7f3a';

let tmp: string;
let worklist: string;
let server: ServeProcess;

beforeAll(async () => {
  tmp = mkdtempSync(join(tmpdir(), 'zvet-serve-'));
  worklist = join(tmp, 'night');
  const outside = join(tmp, 'outside');
  mkdirSync(worklist);
  mkdirSync(outside);
  cpSync(join(DEMO_WORKLIST, 'KRT-26-0011.fits'), join(worklist, 'KRT-26-0011.fits'));
  cpSync(join(DEMO_WORKLIST, 'KRT-26-0018.csv'), join(worklist, 'KRT-26-0018.csv'));
  // A spectrum-looking symlink and a folder symlink, both leading out of the worklist.
  cpSync(join(DEMO_WORKLIST, 'KRT-26-0012.fits'), join(outside, 'elsewhere.fits'));
  writeFileSync(join(outside, 'secret.csv'), `${SECRET}\n`);
  symlinkSync(join(outside, 'elsewhere.fits'), join(worklist, 'KRT-26-0099.fits'));
  symlinkSync(outside, join(worklist, 'linked-out'));
  server = await startServe(worklist, join(tmp, 'config'));
});

afterAll(async () => {
  await server?.stop();
  rmSync(tmp, { recursive: true, force: true });
});

describe('zvet serve: start-up', () => {
  it('prints exactly one line, the loopback address with a 32-byte token', () => {
    expect(server.stdout()).toMatch(/^http:\/\/127\.0\.0\.1:\d+\/\?token=[A-Za-z0-9_-]{43}\n$/);
    expect(Buffer.from(server.token, 'base64url')).toHaveLength(32);
  });
});

describe('zvet serve: the token', () => {
  it('refuses the page, static files and the API without a token', async () => {
    expect((await request(server.port, 'GET', '/')).status).toBe(403);
    expect((await request(server.port, 'GET', '/app.js')).status).toBe(403);
    expect((await request(server.port, 'POST', '/api/listSpectra', { headers: { 'Content-Type': 'application/json' }, body: '{}' })).status).toBe(403);
  });

  it('refuses a wrong token in the query, the header and the cookie', async () => {
    const wrong = server.token.slice(0, -1) + (server.token.endsWith('A') ? 'B' : 'A');
    expect((await request(server.port, 'GET', `/?token=${wrong}`)).status).toBe(403);
    expect((await request(server.port, 'GET', `/?token=`)).status).toBe(403);
    expect((await call(server.port, wrong, 'listSpectra', {})).status).toBe(403);
    const cookie = `zvet-token-${server.port}=${wrong}`;
    expect((await request(server.port, 'POST', '/api/listSpectra', { headers: { Cookie: cookie, 'Content-Type': 'application/json' }, body: '{}' })).status).toBe(403);
  });

  it('does not take the query token for the API', async () => {
    const r = await request(server.port, 'POST', `/api/listSpectra?token=${server.token}`, { headers: { 'Content-Type': 'application/json' }, body: '{}' });
    expect(r.status).toBe(403);
  });

  it('opens the page with the right token and hands over an HttpOnly, SameSite=Strict cookie that then lets the API in', async () => {
    const page = await request(server.port, 'GET', `/?token=${server.token}`);
    expect(page.status).toBe(200);
    expect(page.headers['content-type']).toMatch(/^text\/html/);
    const cookie = page.headers['set-cookie'];
    expect(cookie).toContain(`zvet-token-${server.port}=${server.token}`);
    expect(cookie).toMatch(/HttpOnly/);
    expect(cookie).toMatch(/SameSite=Strict/);
    const api = await request(server.port, 'POST', '/api/listSpectra', {
      headers: { Cookie: cookie.split(';')[0], 'Content-Type': 'application/json' },
      body: '{}',
    });
    expect(api.status).toBe(200);
    expect(JSON.parse(api.body).items.length).toBeGreaterThan(0);
  });

  it('lets the browser revalidate its copy of a static file (ETag, 304) but still needs the token for it', async () => {
    const first = await request(server.port, 'GET', '/plotly.min.js', { token: server.token });
    expect(first.status).toBe(200);
    const etag = first.headers.etag;
    expect(etag).toMatch(/^"[0-9a-z]+-[0-9a-z]+"$/);
    const again = await request(server.port, 'GET', '/plotly.min.js', { token: server.token, headers: { 'If-None-Match': etag } });
    expect(again.status).toBe(304);
    expect(again.body).toBe('');
    const stale = await request(server.port, 'GET', '/plotly.min.js', { token: server.token, headers: { 'If-None-Match': '"other"' } });
    expect(stale.status).toBe(200);
    expect((await request(server.port, 'GET', '/plotly.min.js', { token: null, headers: { 'If-None-Match': etag } })).status).toBe(403);
  });

  it('sends the strict security headers', async () => {
    const page = await request(server.port, 'GET', `/?token=${server.token}`);
    const csp = page.headers['content-security-policy'];
    for (const directive of ["default-src 'self'", "script-src 'self'", "connect-src 'self'", "img-src 'self' data: blob:", "object-src 'none'", "frame-ancestors 'none'", "base-uri 'none'"]) {
      expect(csp).toContain(directive);
    }
    expect(csp).not.toMatch(/script-src[^;]*unsafe/);
    expect(page.headers['x-content-type-options']).toBe('nosniff');
    expect(page.headers['referrer-policy']).toBe('no-referrer');
    const api = await call(server.port, server.token, 'getSettings', {});
    expect(api.headers['cache-control']).toBe('no-store');
  });
});

describe('zvet serve: Host and Origin (DNS rebinding)', () => {
  it.each([
    ['a foreign name', (p: number) => `evil.example:${p}`],
    ['the right name on another port', (p: number) => `127.0.0.1:${p + 1}`],
    ['no port', () => '127.0.0.1'],
    ['a rebound name', (p: number) => `127.0.0.1.nip.example:${p}`],
    ['the IPv6 loopback', (p: number) => `[::1]:${p}`],
  ])('refuses Host: %s, even with the right token', async (_what, host) => {
    const r = await call(server.port, server.token, 'listSpectra', {});
    expect(r.status).toBe(200);
    const forged = await request(server.port, 'POST', '/api/listSpectra', { token: server.token, host: host(server.port), headers: { 'Content-Type': 'application/json' }, body: '{}' });
    expect(forged.status).toBe(403);
  });

  it('takes localhost:PORT as well', async () => {
    const r = await request(server.port, 'POST', '/api/getSettings', { token: server.token, host: `localhost:${server.port}`, headers: { 'Content-Type': 'application/json' }, body: '{}' });
    expect(r.status).toBe(200);
  });

  it.each(['http://evil.example', 'null', 'http://127.0.0.1:1', 'https://127.0.0.1:PORT', 'http://127.0.0.1:PORT.evil.example'])('refuses Origin %s', async (origin) => {
    const r = await request(server.port, 'POST', '/api/getSettings', {
      token: server.token,
      headers: { Origin: origin.replace('PORT', String(server.port)), 'Content-Type': 'application/json' },
      body: '{}',
    });
    expect(r.status).toBe(403);
  });

  it('takes its own Origin', async () => {
    const r = await request(server.port, 'POST', '/api/getSettings', { token: server.token, headers: { Origin: `http://127.0.0.1:${server.port}`, 'Content-Type': 'application/json' }, body: '{}' });
    expect(r.status).toBe(200);
  });
});

describe('zvet serve: paths', () => {
  it.each([
    '/../package.json',
    '/../../etc/passwd',
    '/%2e%2e/package.json',
    '/%2E%2E/%2E%2E/etc/passwd',
    '/..%2fpackage.json',
    '/%2e%2e%2fpackage.json',
    '/..%5cpackage.json',
    '/..\\package.json',
    '//etc/passwd',
    '/etc/passwd',
    '/C:/Windows/win.ini',
    '/%00index.html',
    '/.%2e/package.json',
    `/${'..%2f'.repeat(8)}etc/passwd`,
  ])('refuses static path %s', async (path) => {
    const r = await request(server.port, 'GET', path, { token: server.token });
    expect([403, 404]).toContain(r.status);
    expect(r.body).not.toContain('"name": "zvet"');
    expect(r.body).not.toContain('root:');
  });

  it('refuses ids that are not entries of the worklist (relative escapes, absolute paths)', async () => {
    for (const id of ['../outside/secret.csv', join(tmp, 'outside', 'secret.csv'), 'linked-out/secret.csv', '/etc/passwd', 'KRT-26-0011.fits/../../outside/secret.csv']) {
      const r = await call(server.port, server.token, 'loadSpectrum', { id });
      expect(r.status, id).toBe(404);
      expect(r.body).not.toContain(SECRET);
    }
  });

  it('leaves symlinks out of a folder worklist, and refuses a symlinked file given by name without reading it', async () => {
    const list = JSON.parse((await call(server.port, server.token, 'listSpectra', {})).body);
    const ids = list.items.map((i: { id: string }) => i.id);
    expect(ids).toEqual(['KRT-26-0011.fits', 'KRT-26-0018.csv']);
    // Left out, and said so.
    expect(list.warnings).toContainEqual(expect.stringMatching(/^2 symbolic links are left out of the worklist \(only files inside its folder are read\): KRT-26-0099\.fits, linked-out$/));
    expect((await call(server.port, server.token, 'loadSpectrum', { id: 'KRT-26-0099.fits' })).status).toBe(404);

    const byName = await call(server.port, server.token, 'openWorklist', { files: [join(worklist, 'KRT-26-0011.fits'), join(worklist, 'KRT-26-0099.fits')] });
    expect(byName.status).toBe(200);
    const linked = JSON.parse(byName.body).items.find((i: { id: string }) => i.id === 'KRT-26-0099.fits');
    expect(linked.error).toMatch(/outside the worklist/);
    const view = JSON.parse((await call(server.port, server.token, 'loadSpectrum', { id: 'KRT-26-0099.fits' })).body);
    expect(view.arrays).toBeNull();
    expect(view.error).toMatch(/outside the worklist/);
    expect((await call(server.port, server.token, 'openWorklist', { path: worklist })).status).toBe(200);
  });

  it('refuses exports that lead out through a symlinked folder or have the wrong extension', async () => {
    const viaLink = await call(server.port, server.token, 'exportCatalogue', { format: 'csv', path: join(worklist, 'linked-out', 'cat.csv') });
    expect(viaLink.status).toBe(400);
    expect(JSON.parse(viaLink.body).error).toMatch(/symlink/);
    const relative = await call(server.port, server.token, 'exportCatalogue', { format: 'csv', path: '../outside/cat.csv' });
    expect(relative.status).toBe(400);
    const wrongExt = await call(server.port, server.token, 'exportCatalogue', { format: 'csv', path: join(tmp, 'bashrc') });
    expect(wrongExt.status).toBe(400);
  });

  it('refuses opening a relative path', async () => {
    const r = await call(server.port, server.token, 'openWorklist', { path: '../outside' });
    expect(r.status).toBe(400);
  });
});

describe('zvet serve: malformed and oversized requests', () => {
  it('refuses a body declared over 1 MiB with 413 before reading it', async () => {
    const head = [`POST /api/loadSpectrum HTTP/1.1`, `Host: 127.0.0.1:${server.port}`, `X-Zvet-Token: ${server.token}`, 'Content-Type: application/json', `Content-Length: ${1024 * 1024 + 1}`, 'Connection: close', ''].join('\n');
    const r = await rawRequest(server.port, head, '{"id":"');
    expect(r.status).toBe(413);
  });

  it('refuses a chunked body that grows over 1 MiB with 413', async () => {
    const chunk = 'a'.repeat(64 * 1024);
    const chunks = Array.from({ length: 20 }, () => `${chunk.length.toString(16)}\r\n${chunk}\r\n`).join('') + '0\r\n\r\n';
    const head = [`POST /api/loadSpectrum HTTP/1.1`, `Host: 127.0.0.1:${server.port}`, `X-Zvet-Token: ${server.token}`, 'Content-Type: application/json', 'Transfer-Encoding: chunked', 'Connection: close', ''].join('\n');
    const r = await rawRequest(server.port, head, chunks);
    expect(r.status).toBe(413);
  });

  it('refuses malformed JSON with 400 and a one-line reason', async () => {
    const r = await request(server.port, 'POST', '/api/listSpectra', { token: server.token, headers: { 'Content-Type': 'application/json' }, body: '{"a":' });
    expect(r.status).toBe(400);
    expect(JSON.parse(r.body).error).toMatch(/^malformed JSON/);
  });

  it('refuses a body that is not JSON-typed with 415', async () => {
    const r = await request(server.port, 'POST', '/api/listSpectra', { token: server.token, headers: { 'Content-Type': 'text/plain' }, body: '{}' });
    expect(r.status).toBe(415);
  });

  it('refuses wrong types with 400 naming the field', async () => {
    const r = await call(server.port, server.token, 'templateModel', { id: 'KRT-26-0011.fits', template: 'passive', z: 'high' });
    expect(r.status).toBe(400);
    const reason = JSON.parse(r.body).error as string;
    expect(reason).toMatch(/^templateModel: z: expected a finite number/);
    expect(reason).not.toContain('\n');
    const bad = await call(server.port, server.token, 'saveVerdict', { id: 'KRT-26-0011.fits', status: 'great', z: 0.1, zErr: null, confidence: null, objectClass: 'galaxy', template: null, note: '' });
    expect(bad.status).toBe(400);
    expect(JSON.parse(bad.body).error).toMatch(/status: expected one of accepted, revised, no-redshift, pending/);
  });

  it('refuses a URL over 8 KiB with 414', async () => {
    expect((await request(server.port, 'GET', `/?token=${server.token}&pad=${'a'.repeat(9000)}`)).status).toBe(414);
  });

  it('answers an unknown method with 404 and a GET on the API with 405', async () => {
    expect((await call(server.port, server.token, 'deleteEverything', {})).status).toBe(404);
    expect((await call(server.port, server.token, '__proto__', {})).status).toBe(404);
    expect((await call(server.port, server.token, 'constructor', {})).status).toBe(404);
    expect((await request(server.port, 'GET', '/api/listSpectra', { token: server.token })).status).toBe(405);
  });

  it('is still up and answering after all of the above', async () => {
    const r = await call(server.port, server.token, 'listSpectra', {});
    expect(r.status).toBe(200);
    expect(server.child.exitCode).toBeNull();
  });
});

describe('zvet serve: stopping', () => {
  it('a second start gets another token, and SIGINT stops it with exit code 0', async () => {
    const second = await startServe(worklist, join(tmp, 'config'));
    expect(second.token).not.toBe(server.token);
    expect(await second.stop('SIGINT')).toBe(0);
  });

  it('a start on a port in use says so in one line and exits with code 2 (it stayed up, its measuring threads running)', () => {
    const r = spawnSync(process.execPath, [ZVET_BIN, 'serve', worklist, '--port', String(server.port), '--no-open'], { encoding: 'utf8', timeout: 30_000, env: { ...process.env, ZVET_CONFIG_DIR: join(tmp, 'config') } });
    expect(r.signal).toBeNull();
    expect(r.status).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr.trimEnd().split('\n').at(-1)).toBe(`zvet: port ${server.port} on 127.0.0.1 is in use (another zvet serve?): give another with --port, or --port 0 for a free one`);
  });
});
