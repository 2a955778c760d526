import { z } from 'zod';
import { TimestampSchema } from '../../shared/protocol/messages';

// What really happened in a simulated run, written next to it so the service's findings can be checked.
// Times named `...At` are the gateway's clock (what the service sees in `ts`); `true...` is simulated time.

export const PhysicalOutcomeSchema = z.enum(['completed', 'interrupted', 'resumed']);
export const ExpectedOutcomeSchema = z.enum(['completed', 'interrupted', 'resumed', 'undetermined']);
export type ExpectedOutcome = z.infer<typeof ExpectedOutcomeSchema>;

export const IsolatorActionSchema = z.object({
  opened: z.boolean(),
  /** hasty: seconds after key-off; afterSafe: after the purge; bounced: opened and put back at once. */
  how: z.enum(['none', 'hasty', 'afterSafe', 'bounced']),
  at: TimestampSchema.nullable(),
  secondsAfterKeyOff: z.number().nullable(),
  /** Whether the gateway's hold-up reserve got `supply-lost` out. */
  lossReported: z.boolean().nullable(),
});

export const KeyOffTruthSchema = z.object({
  unitId: z.string(),
  gatewayId: z.string(),
  boot: z.number().int().nonnegative(),
  keyOffAt: TimestampSchema,
  trueKeyOffAt: TimestampSchema,
  purgeSeconds: z.number().int().positive(),
  isolator: IsolatorActionSchema,
  /** What happened to the purge. */
  outcome: PhysicalOutcomeSchema,
  /** What the service can know from what the gateway delivered: the outcome, or undetermined when no evidence got out. */
  expectedOutcome: ExpectedOutcomeSchema,
  secondsIntoPurge: z.number().nullable(),
  ambientC: z.number().nullable(),
});
export type KeyOffTruth = z.infer<typeof KeyOffTruthSchema>;

export const FaultTruthSchema = z.object({
  unitId: z.string(),
  at: TimestampSchema,
  sourceAddress: z.number().int().min(0).max(255),
  spn: z.number().int().nonnegative(),
  fmi: z.number().int().min(0).max(31),
  occurrenceCount: z.number().int().min(0).max(127),
  /** The interrupted purge (its keyOffAt) this fault follows from, when the service can link it. */
  linkedKeyOffAt: TimestampSchema.nullable(),
});
export type FaultTruth = z.infer<typeof FaultTruthSchema>;

export const CoverageGapSchema = z.object({ unitId: z.string(), gatewayId: z.string(), from: TimestampSchema, to: TimestampSchema });

export const FleetUnitTruthSchema = z.object({
  unitId: z.string(),
  gatewayId: z.string(),
  name: z.string(),
  depot: z.string(),
  systemVoltage: z.union([z.literal(12), z.literal(24)]),
  purgeSeconds: z.number().int(),
  driverHabit: z.enum(['waits', 'hasty', 'never']),
});

export const TruthSchema = z.object({
  version: z.literal(1),
  scenario: z.string(),
  seed: z.string(),
  start: TimestampSchema,
  end: TimestampSchema,
  fleet: z.array(FleetUnitTruthSchema),
  keyOffs: z.array(KeyOffTruthSchema),
  faults: z.array(FaultTruthSchema),
  coverageGaps: z.array(CoverageGapSchema),
});
export type Truth = z.infer<typeof TruthSchema>;
