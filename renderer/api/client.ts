/**
 * The window's one way to the host: the Electron preload's `window.zvetHost` when present,
 * otherwise the loopback HTTP transport of browser mode (POST /api/<method>, JSON both ways).
 * Both carry exactly the HostApi of core/api/host-api.ts.
 */
import { HOST_METHODS, type HostApi, type HostError, type HostMethod } from '../../core/api/host-api.js';

/** A host call that failed; `message` is the host's one line for the user. */
export class HostCallError extends Error {
  readonly method: string;
  readonly status: number;
  constructor(method: string, message: string, status: number) {
    super(message);
    this.name = 'HostCallError';
    this.method = method;
    this.status = status;
  }
}

declare global {
  interface Window {
    zvetHost?: HostApi;
  }
}

type Call = <M extends HostMethod>(method: M, req: Parameters<HostApi[M]>[0]) => ReturnType<HostApi[M]>;

function httpCall(token: string | null): Call {
  return (async (method: HostMethod, req: unknown) => {
    const headers: Record<string, string> = { 'Content-Type': 'application/json' };
    if (token) headers['X-Zvet-Token'] = token;
    let res: Response;
    try {
      res = await fetch(`/api/${method}`, { method: 'POST', headers, body: JSON.stringify(req), credentials: 'same-origin' });
    } catch (err) {
      throw new HostCallError(method, `the zvet host did not answer (${(err as Error).message})`, 0);
    }
    const text = await res.text();
    let body: unknown;
    try {
      body = JSON.parse(text);
    } catch {
      throw new HostCallError(method, `the host sent an unreadable answer (HTTP ${res.status})`, res.status);
    }
    if (!res.ok) throw new HostCallError(method, (body as HostError).error ?? `HTTP ${res.status}`, res.status);
    return body;
  }) as Call;
}

function electronCall(host: HostApi): Call {
  return (async (method: HostMethod, req: unknown) => {
    try {
      return await (host[method] as (r: unknown) => Promise<unknown>)(req);
    } catch (err) {
      const e = err as Partial<HostError> & { message?: string };
      throw new HostCallError(method, e.error ?? e.message ?? String(err), e.status ?? 500);
    }
  }) as Call;
}

/** The HostApi over whichever transport this window has. */
export function connectHost(): HostApi {
  const call: Call = window.zvetHost ? electronCall(window.zvetHost) : httpCall(new URLSearchParams(location.search).get('token'));
  const api = {} as Record<HostMethod, unknown>;
  for (const m of HOST_METHODS) api[m] = (req: never) => call(m, req);
  return api as unknown as HostApi;
}
