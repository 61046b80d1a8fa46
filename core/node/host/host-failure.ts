import type { HostError } from '../../api/host-api.js';

/**
 * An expected failure of a host call (unknown id, unreadable file, full disk …): the transports
 * turn it into a HostError with this one-line message and HTTP-like status.
 */
export class HostFailure extends Error {
  readonly status: number;
  constructor(status: number, message: string) {
    super(message);
    this.name = 'HostFailure';
    this.status = status;
  }

  toHostError(): HostError {
    return { error: this.message, status: this.status };
  }
}
