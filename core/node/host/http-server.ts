/**
 * Browser mode's transport: the host API over loopback HTTP. It binds 127.0.0.1 only and lets in
 * nothing without the per-start token (query on first load, then the HttpOnly cookie or the
 * X-Zvet-Token header), and nothing whose Host or Origin is not this very loopback address and
 * port (so a DNS-rebound page cannot reach it). All logic stays in the handlers behind dispatch().
 */
import { randomBytes, timingSafeEqual } from 'node:crypto';
import { readFile } from 'node:fs/promises';
import { createServer, type IncomingMessage, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import type { HostApi } from '../../api/host-api.js';
import { dispatch } from './dispatch.js';
import { SECURITY_HEADERS } from './security-headers.js';
import { resolveStaticFile } from './static-files.js';

export interface HostServerOptions {
  api: HostApi;
  /** Folder of the built window (index.html, app.js, app.css, plotly). */
  staticRoot: string;
  /** 0 picks a free port. */
  port: number;
  maxBodyBytes?: number;
  maxUrlBytes?: number;
}

export interface RunningHostServer {
  port: number;
  token: string;
  /** The one address to open: http://127.0.0.1:PORT/?token=… */
  url: string;
  close(): Promise<void>;
}

export const DEFAULT_MAX_BODY_BYTES = 1024 * 1024;
export const DEFAULT_MAX_URL_BYTES = 8 * 1024;
const LOOPBACK = '127.0.0.1';

/** 32 random bytes, base64url: new on every start. */
export function newToken(): string {
  return randomBytes(32).toString('base64url');
}

function sameSecret(given: string | undefined, token: string): boolean {
  if (typeof given !== 'string') return false;
  const a = Buffer.from(given);
  const b = Buffer.from(token);
  return a.length === b.length && timingSafeEqual(a, b);
}

function cookieValue(header: string | undefined, name: string): string | undefined {
  for (const part of (header ?? '').split(';')) {
    const eq = part.indexOf('=');
    if (eq > 0 && part.slice(0, eq).trim() === name) return part.slice(eq + 1).trim();
  }
  return undefined;
}

class BodyTooLarge extends Error {}

function readBody(req: IncomingMessage, limit: number): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const declared = Number(req.headers['content-length']);
    if (Number.isFinite(declared) && declared > limit) {
      reject(new BodyTooLarge());
      return;
    }
    const chunks: Buffer[] = [];
    let size = 0;
    let failed = false;
    req.on('data', (chunk: Buffer) => {
      if (failed) return;
      size += chunk.length;
      if (size > limit) {
        failed = true;
        chunks.length = 0;
        reject(new BodyTooLarge());
      } else chunks.push(chunk);
    });
    req.on('end', () => failed || resolve(Buffer.concat(chunks)));
    req.on('error', (err) => failed || reject(err));
  });
}

function send(res: ServerResponse, status: number, body: string, contentType = 'text/plain; charset=utf-8', extra: Record<string, string> = {}): void {
  if (res.headersSent) return;
  res.writeHead(status, { ...SECURITY_HEADERS, 'Content-Type': contentType, 'Cache-Control': 'no-store', ...extra });
  res.end(body);
}

function sendJson(res: ServerResponse, status: number, value: unknown): void {
  send(res, status, JSON.stringify(value), 'application/json; charset=utf-8');
}

export async function startHostServer(options: HostServerOptions): Promise<RunningHostServer> {
  const maxBody = options.maxBodyBytes ?? DEFAULT_MAX_BODY_BYTES;
  const maxUrl = options.maxUrlBytes ?? DEFAULT_MAX_URL_BYTES;
  const token = newToken();
  let port = 0;
  let allowedHosts = new Set<string>();
  let allowedOrigins = new Set<string>();
  let cookieName = '';

  async function serveStatic(req: IncomingMessage, res: ServerResponse, pathname: string, setCookie: boolean): Promise<void> {
    const found = await resolveStaticFile(options.staticRoot, pathname);
    if (!found.ok) {
      const missingWindow = found.status === 404 && (pathname === '/' || pathname === '/index.html');
      send(res, found.status, missingWindow ? 'the window is not built: run npm run build\n' : `${found.reason}\n`);
      return;
    }
    const headers: Record<string, string> = { ...SECURITY_HEADERS, 'Content-Type': found.contentType, 'Cache-Control': 'no-cache', ETag: found.etag };
    if (setCookie) {
      headers['Set-Cookie'] = `${cookieName}=${token}; HttpOnly; SameSite=Strict; Path=/`;
      headers['Cache-Control'] = 'no-store';
      delete headers.ETag;
    } else if (req.headers['if-none-match'] === found.etag) {
      res.writeHead(304, headers);
      res.end();
      return;
    }
    const body = await readFile(found.file);
    res.writeHead(200, headers);
    res.end(req.method === 'HEAD' ? undefined : body);
  }

  async function serveApi(req: IncomingMessage, res: ServerResponse, method: string): Promise<void> {
    if (req.method !== 'POST') {
      send(res, 405, 'host calls use POST\n', undefined, { Allow: 'POST' });
      return;
    }
    const type = (req.headers['content-type'] ?? '').split(';')[0].trim().toLowerCase();
    if (type !== 'application/json') {
      sendJson(res, 415, { error: 'send the request as application/json', status: 415 });
      return;
    }
    let body: unknown;
    try {
      const raw = await readBody(req, maxBody);
      body = raw.length === 0 ? {} : JSON.parse(raw.toString('utf8'));
    } catch (err) {
      if (err instanceof BodyTooLarge) {
        sendJson(res, 413, { error: `request body larger than ${maxBody} bytes`, status: 413 });
        req.resume();
        return;
      }
      sendJson(res, 400, { error: `malformed JSON: ${(err as Error).message.split('\n')[0]}`, status: 400 });
      return;
    }
    const out = await dispatch(options.api, method, body);
    if (out.ok) sendJson(res, 200, out.result);
    else sendJson(res, out.error.status, out.error);
  }

  async function handle(req: IncomingMessage, res: ServerResponse): Promise<void> {
    const rawUrl = req.url ?? '/';
    if (Buffer.byteLength(rawUrl) > maxUrl) return send(res, 414, 'URL too long\n');
    if (!allowedHosts.has(req.headers.host ?? '')) return send(res, 403, 'forbidden: wrong Host\n');
    const origin = req.headers.origin;
    if (origin !== undefined && !allowedOrigins.has(origin)) return send(res, 403, 'forbidden: wrong Origin\n');
    if (!rawUrl.startsWith('/')) return send(res, 400, 'bad request target\n');
    const queryAt = rawUrl.indexOf('?');
    const pathname = queryAt < 0 ? rawUrl : rawUrl.slice(0, queryAt);
    const query = new URLSearchParams(queryAt < 0 ? '' : rawUrl.slice(queryAt + 1));
    const isIndex = pathname === '/' || pathname === '/index.html';
    const queryToken = isIndex && (req.method === 'GET' || req.method === 'HEAD') && sameSecret(query.get('token') ?? undefined, token);
    const headerToken = req.headers['x-zvet-token'];
    const authorised =
      queryToken ||
      sameSecret(cookieValue(req.headers.cookie, cookieName), token) ||
      sameSecret(Array.isArray(headerToken) ? headerToken[0] : headerToken, token);
    if (!authorised) return send(res, 403, 'forbidden: open the address zvet printed (with its token)\n');

    if (pathname.startsWith('/api/')) return serveApi(req, res, pathname.slice('/api/'.length));
    if (req.method !== 'GET' && req.method !== 'HEAD') return send(res, 405, 'method not allowed\n', undefined, { Allow: 'GET, HEAD' });
    return serveStatic(req, res, pathname, queryToken);
  }

  const server = createServer({ requestTimeout: 60_000 }, (req, res) => {
    handle(req, res).catch((err: unknown) => send(res, 500, `internal error: ${(err as Error).message.split('\n')[0]}\n`));
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port, LOOPBACK, () => {
      server.off('error', reject);
      resolve();
    });
  });
  port = (server.address() as AddressInfo).port;
  allowedHosts = new Set([`${LOOPBACK}:${port}`, `localhost:${port}`]);
  allowedOrigins = new Set([`http://${LOOPBACK}:${port}`, `http://localhost:${port}`]);
  // Cookies ignore ports; naming it by port keeps two servers on one machine apart.
  cookieName = `zvet-token-${port}`;

  return {
    port,
    token,
    url: `http://${LOOPBACK}:${port}/?token=${token}`,
    close: () =>
      new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      }),
  };
}
