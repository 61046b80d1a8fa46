/** IPC channel names: one per host method, the same list in the main process and the preload. */
import type { HostMethod } from '../core/api/host-api.js';

const PREFIX = 'zvet:';

export function channelFor(method: HostMethod): string {
  return `${PREFIX}${method}`;
}

/** The method a channel stands for, or null for a channel that is not ours. */
export function methodOfChannel(channel: string): string | null {
  return channel.startsWith(PREFIX) ? channel.slice(PREFIX.length) : null;
}
