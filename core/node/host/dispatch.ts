/**
 * The one entry point both transports (loopback HTTP and Electron IPC) call: it refuses unknown
 * methods, checks the request's shape, runs the handler and maps every failure to a HostError.
 * Transports add only their own checks (token, Host, sender) around it.
 */
import type { HostApi, HostError } from '../../api/host-api.js';
import { describeFailure } from '../cli/run-action.js';
import { HostFailure } from './host-failure.js';
import { isHostMethod, validateRequest } from './request-shapes.js';

export type DispatchResult = { ok: true; result: unknown } | { ok: false; error: HostError };

export async function dispatch(api: HostApi, method: unknown, body: unknown): Promise<DispatchResult> {
  if (!isHostMethod(method)) {
    return { ok: false, error: { error: `unknown method ${JSON.stringify(String(method)).slice(0, 80)}`, status: 404 } };
  }
  const checked = validateRequest(method, body);
  if (!checked.ok) return { ok: false, error: { error: `${method}: ${checked.reason}`, status: 400 } };
  try {
    const call = api[method] as (req: unknown) => Promise<unknown>;
    return { ok: true, result: await call.call(api, checked.value) };
  } catch (err) {
    if (err instanceof HostFailure) return { ok: false, error: err.toHostError() };
    return { ok: false, error: { error: `${method} failed: ${describeFailure(err)}`, status: 500 } };
  }
}
