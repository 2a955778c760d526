import type { UnitEvent } from '../detection/types';
import type { CanFrame } from '../../shared/protocol/messages';

/** An accepted gateway message on its way into the raw history and the judgement. */
export interface MessageItem {
  type: 'message';
  gatewayId: string;
  unitId: string;
  stream: number;
  boot: number;
  seq: number;
  ts: number;
  kind: 'telemetry' | 'can' | 'power';
  /** The validated payload as stored. */
  payload: Record<string, unknown>;
  event: UnitEvent;
  frames: CanFrame[] | null;
  receivedAt: number;
}

export interface QuarantineItem {
  type: 'quarantine';
  gatewayId: string | null;
  topic: string;
  reason: string;
  excerpt: string;
}

/** Re-judge a unit without a new message: a deadline (C + 30 s, a silence limit) has passed, or its profile changed. */
export interface TickItem {
  type: 'tick';
  unitId: string;
}

export type IngestItem = MessageItem | QuarantineItem | TickItem;
