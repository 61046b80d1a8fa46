// Starts `zvet serve` as a child process, as a user would, and speaks raw HTTP to it so that
// requests reach the server exactly as written (no client-side path clean-up or Host fix-up).
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync } from 'node:fs';
import { connect } from 'node:net';
import { resolve } from 'node:path';
import { ROOT, ZVET_BIN } from '../support/paths';

export interface ServeProcess {
  child: ChildProcess;
  url: string;
  port: number;
  token: string;
  stdout: () => string;
  stderr: () => string;
  stop(signal?: NodeJS.Signals): Promise<number | null>;
}

/** Starts `zvet serve FOLDER`, or with `folder` null `zvet serve` with no worklist open. */
export function startServe(folder: string | null, configDir: string): Promise<ServeProcess> {
  return startServingScript([ZVET_BIN, 'serve', ...(folder === null ? [] : [folder]), '--port', '0', '--no-open'], { ZVET_CONFIG_DIR: configDir });
}

/** Runs a Node script that ends in `zvet serve` and waits for the address line it prints. */
export async function startServingScript(args: string[], env: Record<string, string>): Promise<ServeProcess> {
  if (!existsSync(resolve(ROOT, 'dist/cli.js'))) throw new Error('dist/cli.js is missing: run npm run build first');
  const child = spawn(process.execPath, args, { cwd: ROOT, env: { ...process.env, ...env }, stdio: ['ignore', 'pipe', 'pipe'] });
  let out = '';
  let err = '';
  child.stdout!.on('data', (d: Buffer) => (out += d.toString()));
  child.stderr!.on('data', (d: Buffer) => (err += d.toString()));
  // Exit code 0 after a stop signal means it was handled; a death by the signal shows as null.
  const exited = new Promise<number | null>((done) => child.on('exit', (code) => done(code)));
  const url = await new Promise<string>((done, fail) => {
    const timer = setInterval(() => {
      if (out.includes('\n')) {
        clearInterval(timer);
        done(out.split('\n')[0]);
      }
    }, 20);
    exited.then((code) => {
      clearInterval(timer);
      fail(new Error(`${args.join(' ')} exited with ${code}: ${err.trim()}`));
    });
  });
  const m = /^http:\/\/127\.0\.0\.1:(\d+)\/\?token=(.+)$/.exec(url);
  if (!m) throw new Error(`unexpected first line: ${url}`);
  return {
    child,
    url,
    port: Number(m[1]),
    token: m[2],
    stdout: () => out,
    stderr: () => err,
    stop: async (signal = 'SIGTERM') => {
      if (child.exitCode === null) child.kill(signal);
      return exited;
    },
  };
}

export interface RawResponse {
  status: number;
  headers: Record<string, string>;
  body: string;
}

/** Sends one request exactly as given (request line, headers, body) and reads the whole reply. */
export function rawRequest(port: number, head: string, body: Buffer | string = ''): Promise<RawResponse> {
  return new Promise((done, fail) => {
    const socket = connect(port, '127.0.0.1');
    const chunks: Buffer[] = [];
    socket.on('data', (d) => chunks.push(d));
    // The server may answer (413) and close before the whole body is sent: keep what it said.
    let failure: Error | null = null;
    socket.on('error', (e) => (failure = e));
    socket.on('close', () => (chunks.length > 0 ? finish() : fail(failure ?? new Error('connection closed without a reply: ' + head.split('\n')[0]))));
    let finished = false;
    function finish() {
      if (finished) return;
      finished = true;
      const text = Buffer.concat(chunks).toString('utf8');
      const split = text.indexOf('\r\n\r\n');
      const lines = text.slice(0, split).split('\r\n');
      const status = Number(lines[0].split(' ')[1]);
      const headers: Record<string, string> = {};
      for (const line of lines.slice(1)) {
        const c = line.indexOf(':');
        headers[line.slice(0, c).trim().toLowerCase()] = line.slice(c + 1).trim();
      }
      let rest = text.slice(split + 4);
      if (headers['transfer-encoding'] === 'chunked') rest = unchunk(rest);
      done({ status, headers, body: rest });
    }
    // Like a browser, never half-close: the server closes after its reply (Connection: close).
    socket.write(head.replace(/\n/g, '\r\n') + '\r\n');
    if (body.length > 0) socket.write(body);
  });
}

function unchunk(text: string): string {
  let out = '';
  let at = 0;
  for (;;) {
    const eol = text.indexOf('\r\n', at);
    if (eol < 0) return out;
    const size = parseInt(text.slice(at, eol), 16);
    if (!(size > 0)) return out;
    out += text.slice(eol + 2, eol + 2 + size);
    at = eol + 2 + size + 2;
  }
}

/** A request line plus the headers that make it legitimate (right Host, token header). */
export function request(port: number, method: string, path: string, opts: { token?: string | null; host?: string; headers?: Record<string, string>; body?: string | Buffer } = {}): Promise<RawResponse> {
  const headers: Record<string, string> = { Host: opts.host ?? `127.0.0.1:${port}`, Connection: 'close', ...opts.headers };
  if (opts.token) headers['X-Zvet-Token'] = opts.token;
  const body = opts.body ?? '';
  if (body.length > 0 || method === 'POST') headers['Content-Length'] = String(Buffer.byteLength(body));
  const head = [`${method} ${path} HTTP/1.1`, ...Object.entries(headers).map(([k, v]) => `${k}: ${v}`), ''].join('\n');
  return rawRequest(port, head, body);
}

/** A host call with the token header and a JSON body. */
export function call(port: number, token: string, method: string, body: unknown): Promise<RawResponse> {
  return request(port, 'POST', `/api/${method}`, { token, headers: { 'Content-Type': 'application/json' }, body: JSON.stringify(body) });
}
