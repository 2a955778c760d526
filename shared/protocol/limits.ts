// Limits and defaults fixed by the gateway protocol, version 1.
export const PROTOCOL_VERSION = 1;
export const TOPIC_ROOT = 'afterwatch/v1/gw';
export const GATEWAY_ID_PATTERN = /^[A-Za-z0-9][A-Za-z0-9_-]{0,63}$/;
export const MAX_PAYLOAD_BYTES = 64 * 1024;
export const MAX_FRAMES_PER_MESSAGE = 200;
/** ISO 8601 UTC with milliseconds, exactly as the protocol writes it. */
export const TS_PATTERN = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\.\d{3}Z$/;

// Common practice is to wait at least two minutes after key-off before isolating (no published source).
export const DEFAULT_PURGE_SECONDS = 120;
export const MIN_PURGE_SECONDS = 10;
export const MAX_PURGE_SECONDS = 3600;
/** A design choice: half the nominal system voltage is far below any resting battery, so only a cut supply reads under it. */
export function defaultLossThresholdV(systemVoltage: 12 | 24): number {
  return systemVoltage === 24 ? 12.0 : 6.0;
}
/** Protocol rule 6: pending until C + 30 s. */
export const SETTLE_GRACE_MS = 30_000;
/** Protocol rule 8: contact is lost after 60 s of silence with the key on, 20 min in safeToIsolate. */
export const KEY_ON_SILENCE_MS = 60_000;
export const SAFE_SILENCE_MS = 20 * 60_000;
/** Protocol rule 10: faults up to 10 min after the first key-on after an interruption are linked to it. */
export const FAULT_LINK_WINDOW_MS = 10 * 60_000;
/** ISO 22241-1: AUS 32 (DEF) freezes at about -11 °C. */
export const DEF_FREEZE_POINT_C = -11;
