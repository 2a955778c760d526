// The live feed's messages, defined once for the server and the browser (WebSocket at /api/live).
import { z } from 'zod';
import { UNIT_STATES } from '../api/units';

const Iso = z.string();

/** What changed of a unit: enough for a board row and the switch page. */
export const UnitDeltaSchema = z.object({
  id: z.string(),
  depot: z.string(),
  state: z.enum(UNIT_STATES).nullable(),
  stateSince: Iso.nullable(),
  /** Whole seconds to the purge's end when sent (purging only); the browser counts down from its receipt. */
  purgeRemainingS: z.number().int().nonnegative().nullable(),
  lastSupplyV: z.number().nullable(),
  lastAmbientC: z.number().nullable(),
  lastSeenAt: Iso.nullable(),
});
export type UnitDelta = z.infer<typeof UnitDeltaSchema>;

export const IndicatorViewSchema = z.object({
  /** What the light beside the switch shows; `unknown` where the service has nothing to say (no contact). */
  state: z.enum(['hold', 'clear', 'dark', 'unknown']),
  remainingS: z.number().int().nonnegative().nullable(),
  /** hold because the last purge was interrupted (run it again), rather than a purge in progress. */
  rerunNeeded: z.boolean(),
  since: Iso.nullable(),
});
export type IndicatorView = z.infer<typeof IndicatorViewSchema>;

export const AlertViewSchema = z.object({
  id: z.number(),
  unitId: z.string(),
  depot: z.string(),
  kind: z.enum(['interruptedPurge', 'undeterminedCold', 'contactLost', 'forecastFreeze']),
  status: z.enum(['open', 'acknowledged', 'resolved']),
  raisedAt: Iso,
  episodeId: z.number().nullable(),
  secondsIntoPurge: z.number().nullable(),
  ambientC: z.number().nullable(),
  minAmbientAfterC: z.number().nullable(),
  freezeExposure: z.string().nullable(),
  escalatedAt: Iso.nullable(),
  acknowledgedAt: Iso.nullable(),
  acknowledgedBy: z.string().nullable(),
  resolvedAt: Iso.nullable(),
  resolvedBy: z.string().nullable(),
  comment: z.string().nullable(),
});
export type AlertView = z.infer<typeof AlertViewSchema>;

export const ServerMessageSchema = z.discriminatedUnion('type', [
  z.object({ type: z.literal('hello'), serverTime: Iso, scope: z.enum(['fleet', 'switch']) }),
  z.object({ type: z.literal('units'), sentAt: Iso, units: z.array(UnitDeltaSchema) }),
  z.object({ type: z.literal('episodes'), unitIds: z.array(z.string()) }),
  z.object({ type: z.literal('alert'), alert: AlertViewSchema }),
  z.object({ type: z.literal('switch'), sentAt: Iso, unitId: z.string(), indicator: IndicatorViewSchema }),
]);
export type ServerMessage = z.infer<typeof ServerMessageSchema>;

/** The browser may only ask for a fresh copy of everything (after it was away). */
export const ClientMessageSchema = z.discriminatedUnion('type', [z.object({ type: z.literal('resync') })]);
export type ClientMessage = z.infer<typeof ClientMessageSchema>;

export const LIVE_PATH = '/api/live';
