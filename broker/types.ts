export interface CredentialResult {
  ok: boolean;
  /** The service's own credential (an ingest worker or a tool of the service), not a gateway. */
  service?: boolean;
}
export type CheckCredential = (username: string, password: string) => Promise<CredentialResult>;

/** The service's ingest: resolves once the message is committed (or quarantined); rejects if it could not be. */
export type Accept = (gatewayId: string, topic: string, payload: Buffer) => Promise<void>;

export interface BrokerCounters {
  authRefused: number;
  publishRefused: number;
  oversized: number;
  subscribeRefused: number;
  acceptFailed: number;
  /** Times the broker stopped reading from every connection because too many publishes were unsettled. */
  readPauses: number;
}

/** Counters at zero: the one list of them (the broker's thread lays its shared slots out in this order). */
export const zeroCounters = (): BrokerCounters => ({ authRefused: 0, publishRefused: 0, oversized: 0, subscribeRefused: 0, acceptFailed: 0, readPauses: 0 });

export interface BrokerEvents {
  onConnect?(gatewayId: string): void;
  onDisconnect?(gatewayId: string): void;
}
