import { z } from 'zod';
import { GATEWAY_ID_PATTERN, MAX_PURGE_SECONDS, MIN_PURGE_SECONDS } from '../../../../shared/protocol/limits';

/** "91, 3216" -> [91, 3216]; empty -> null (no narrowing). SPNs are 19-bit (SAE J1939-73: 0 to 524287). */
export const LinkSpnsTextSchema = z
  .string()
  .trim()
  .transform((text, ctx) => {
    if (text === '') return null;
    const parts = text.split(/[\s,]+/).filter(Boolean);
    const out: number[] = [];
    for (const p of parts) {
      const n = Number(p);
      if (!/^\d+$/.test(p) || !Number.isSafeInteger(n) || n > 524_287) {
        ctx.addIssue({ code: 'custom', message: `"${p}" is not an SPN (a whole number from 0 to 524287).` });
        return z.NEVER;
      }
      if (!out.includes(n)) out.push(n);
    }
    if (out.length > 100) {
      ctx.addIssue({ code: 'custom', message: 'At most 100 SPNs.' });
      return z.NEVER;
    }
    return out;
  });

export const SystemVoltageSchema = z.union([z.literal(12), z.literal(24)], { error: 'Choose 12 V or 24 V.' });

export const PurgeSecondsSchema = z
  .number({ error: 'Enter the purge time in seconds.' })
  .int('Whole seconds only.')
  .min(MIN_PURGE_SECONDS, `At least ${MIN_PURGE_SECONDS} s.`)
  .max(MAX_PURGE_SECONDS, `At most ${MAX_PURGE_SECONDS} s.`);

export const LossThresholdSchema = z
  .number({ error: 'Enter a voltage.' })
  .positive('Must be above 0 V.')
  .max(30, 'At most 30 V.');

export const UnitIdSchema = z
  .string()
  .trim()
  .regex(GATEWAY_ID_PATTERN, 'Letters, digits, "-" and "_", starting with a letter or digit, at most 64.');

export const UnitProfileSchema = z.object({
  name: z.string().trim().min(1, 'Enter a name.').max(120),
  depot: z.string().trim().min(1, 'Enter a depot.').max(120),
  systemVoltage: SystemVoltageSchema,
  purgeSeconds: PurgeSecondsSchema,
  lossThresholdV: LossThresholdSchema,
  linkSpns: LinkSpnsTextSchema,
});
export type UnitProfile = z.infer<typeof UnitProfileSchema>;

export const CreateUnitSchema = UnitProfileSchema.extend({ id: UnitIdSchema });
export type CreateUnitInput = z.infer<typeof CreateUnitSchema>;
