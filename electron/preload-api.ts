/**
 * Builds the object the preload exposes as window.zvetHost: exactly the HostApi methods, each
 * one IPC round trip. A failed call rejects with the HostError value ({ error, status }), the
 * same as the HTTP client does, so the window treats both transports alike.
 */
import { HOST_METHODS, type HostApi, type HostMethod } from '../core/api/host-api.js';
import type { IpcReply } from './ipc-route.js';
import { channelFor } from './ipc-channels.js';

export type Invoke = (channel: string, request: unknown) => Promise<IpcReply>;

export function buildPreloadApi(invoke: Invoke): HostApi {
  const api: Partial<Record<HostMethod, (req: unknown) => Promise<unknown>>> = {};
  for (const method of HOST_METHODS) {
    api[method] = async (req: unknown) => {
      const reply = await invoke(channelFor(method), req ?? {});
      if (reply.ok) return reply.result;
      throw reply.error;
    };
  }
  return Object.freeze(api) as unknown as HostApi;
}
