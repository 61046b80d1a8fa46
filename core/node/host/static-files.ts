/**
 * Maps a URL path to a file of the built window (dist/renderer/) without ever leaving that
 * folder: encoded dots and slashes, backslashes, NUL, absolute paths and symlinks pointing out
 * are all refused. Used by the HTTP server and the Electron app protocol alike.
 */
import { realpath, stat } from 'node:fs/promises';
import { extname, isAbsolute, join, sep } from 'node:path';

export const CONTENT_TYPES: Readonly<Record<string, string>> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.mjs': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.json': 'application/json; charset=utf-8',
  '.map': 'application/json; charset=utf-8',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
  '.ico': 'image/x-icon',
  '.woff2': 'font/woff2',
  '.txt': 'text/plain; charset=utf-8',
};

export type StaticLookup = { ok: true; file: string; contentType: string; etag: string } | { ok: false; status: 403 | 404; reason: string };

/** True when `child` is `parent` or lies below it (both already resolved). */
export function isInside(parent: string, child: string): boolean {
  return child === parent || child.startsWith(parent.endsWith(sep) ? parent : parent + sep);
}

/** Resolves the raw (still percent-encoded) path of a request to a file under `root`. */
export async function resolveStaticFile(root: string, rawPath: string): Promise<StaticLookup> {
  let decoded: string;
  try {
    decoded = decodeURIComponent(rawPath);
  } catch {
    return { ok: false, status: 403, reason: 'malformed percent-encoding' };
  }
  if (/%2f|%5c/i.test(rawPath) || decoded.includes('\\') || decoded.includes('\u0000')) {
    return { ok: false, status: 403, reason: 'forbidden characters in path' };
  }
  const segments = decoded.split('/').filter((s) => s !== '');
  // Refusing every dot-segment also refuses '.' and '..'.
  if (segments.some((s) => s.startsWith('.'))) return { ok: false, status: 403, reason: 'path leaves the app folder' };
  const relative = segments.length === 0 ? 'index.html' : segments.join('/');
  if (isAbsolute(relative) || /^[a-z]:/i.test(relative)) return { ok: false, status: 403, reason: 'absolute path' };
  const contentType = CONTENT_TYPES[extname(relative).toLowerCase()];
  if (!contentType) return { ok: false, status: 404, reason: 'not an app file' };
  let realRoot: string;
  let real: string;
  try {
    realRoot = await realpath(root);
    real = await realpath(join(realRoot, relative));
  } catch {
    return { ok: false, status: 404, reason: 'no such file' };
  }
  if (!isInside(realRoot, real)) return { ok: false, status: 403, reason: 'path leaves the app folder' };
  const info = await stat(real).catch(() => null);
  if (!info?.isFile()) return { ok: false, status: 404, reason: 'no such file' };
  // A validator from size and modification time: a reload revalidates (304) and the browser keeps
  // its compiled copy of the 4.8 MB plotly bundle.
  return { ok: true, file: real, contentType, etag: `"${info.size.toString(36)}-${Math.floor(info.mtimeMs).toString(36)}"` };
}
