/**
 * Routes one IPC call from the window to the handlers: only the app's own page may call, only
 * host methods exist, and the request goes through the same shape check as over HTTP.
 * The reply is a plain object (Electron would strip an Error's fields), unwrapped in the preload.
 */
import type { HostApi, HostError } from '../core/api/host-api.js';
import { dispatch } from '../core/node/host/dispatch.js';
import { isAppUrl } from './window-options.js';

export type IpcReply = { ok: true; result: unknown } | { ok: false; error: HostError };

export async function routeIpcCall(api: HostApi, method: string, senderUrl: string | undefined, request: unknown): Promise<IpcReply> {
  if (!senderUrl || !isAppUrl(senderUrl)) {
    return { ok: false, error: { error: 'refused: the call did not come from the zvet window', status: 403 } };
  }
  return dispatch(api, method, request);
}
