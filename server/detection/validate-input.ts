import { z } from 'zod';
import { MAX_PURGE_SECONDS, MIN_PURGE_SECONDS } from '../../shared/protocol/limits';
import type { JudgeInput } from './types';

// The engine's own edge: the ingest shell maps stored messages to these shapes; anything else is a bug
// upstream, so it fails loudly with the path of the bad field rather than judging nonsense.
const Ms = z.number().finite();
const Counter = z.number().int().nonnegative().max(Number.MAX_SAFE_INTEGER);
const Position = { stream: Counter, boot: Counter, seq: Counter };
const Volts = z.number().finite();

const TelemetryEventSchema = z.object({
  kind: z.literal('telemetry'),
  ...Position,
  ts: Ms,
  key: z.enum(['on', 'off']),
  supplyV: Volts,
  ambientC: z.number().finite().nullable(),
  ecmAwake: z.boolean(),
});

const PowerEventSchema = z.object({
  kind: z.literal('power'),
  ...Position,
  ts: Ms,
  event: z.enum(['supply-lost', 'supply-restored', 'boot']),
  supplyV: Volts,
  prevShutdown: z.object({ ts: Ms, cause: z.enum(['supply-lost', 'sleep', 'watchdog', 'unknown']) }).nullable(),
});

const CanEventSchema = z.object({ kind: z.literal('can'), ...Position, ts: Ms });

export const UnitEventSchema = z.discriminatedUnion('kind', [TelemetryEventSchema, PowerEventSchema, CanEventSchema]);

export const ProfileSchema = z.object({
  purgeSeconds: z.number().int().min(MIN_PURGE_SECONDS).max(MAX_PURGE_SECONDS),
  lossThresholdV: z.number().finite().positive(),
});

// Only what the engine reads from a stored episode: its identity and the profile it was judged with.
const PreviousEpisodeSchema = z.object({
  keyOff: z.object({ ...Position, ts: Ms }),
  purgeSeconds: z.number().int().min(MIN_PURGE_SECONDS).max(MAX_PURGE_SECONDS),
  lossThresholdV: z.number().finite().positive(),
});

const ContextSchema = z.object({
  state: z
    .object({
      name: z.enum(['keyOn', 'safeToIsolate', 'isolated', 'interrupted', 'undetermined', 'offUnknown']),
      since: Ms,
    })
    .nullable(),
  lastAmbient: z.object({ ts: Ms, ambientC: z.number().finite() }).nullable(),
  // What the engine reads of a carried wet episode: its identity, profile, and freeze figures so far.
  wet: z
    .array(
      PreviousEpisodeSchema.extend({
        outcome: z.literal('interrupted'),
        minAmbientAfterC: z.number().finite().nullable(),
        nextKeyOnAt: Ms.nullable(),
      }),
    )
    .optional(),
});

const JudgeInputSchema = z.object({
  profile: ProfileSchema,
  events: z.array(UnitEventSchema),
  previousEpisodes: z.array(PreviousEpisodeSchema).optional(),
  now: Ms,
  context: ContextSchema.nullable().optional(),
});

export class EngineInputError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'EngineInputError';
  }
}

/** Throws EngineInputError naming the first bad field; returns nothing (the input is used as given). */
export function assertJudgeInput(input: JudgeInput): void {
  const result = JudgeInputSchema.safeParse(input);
  if (!result.success) {
    const issue = result.error.issues[0];
    throw new EngineInputError(`invalid judge input at ${issue.path.join('.') || '(root)'}: ${issue.message}`);
  }
}
