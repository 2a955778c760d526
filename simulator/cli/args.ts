import { z } from 'zod';
import { ScenarioNameSchema } from '../scenario/scenarios';

/** Splits `--name value` and `--flag` pairs; anything else is a positional argument. */
export function splitArgs(argv: readonly string[]): { named: Record<string, string | true>; positional: string[] } {
  const named: Record<string, string | true> = {};
  const positional: string[] = [];
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    if (a === '--') continue;
    if (!a.startsWith('--')) {
      positional.push(a);
      continue;
    }
    const eq = a.indexOf('=');
    const name = eq > 0 ? a.slice(2, eq) : a.slice(2);
    if (eq > 0) named[name] = a.slice(eq + 1);
    else if (i + 1 < argv.length && !argv[i + 1].startsWith('--')) named[name] = argv[++i];
    else named[name] = true;
  }
  return { named, positional };
}

const Url = (what: string, protocols: string[]) =>
  z.string().refine((s) => {
    try {
      return protocols.includes(new URL(s).protocol);
    } catch {
      return false;
    }
  }, `${what} must be a URL starting with ${protocols.map((p) => `${p}//`).join(' or ')}`);

const SpeedSchema = z
  .string()
  .regex(/^(max|\d+(\.\d+)?)$/, 'must be a number (1 = real time) or "max"')
  .transform((s): number | 'max' => (s === 'max' ? 'max' : Number(s)))
  .refine((v) => v === 'max' || (v > 0 && v <= 1_000_000), 'must be above 0 and at most 1000000, or "max"');

export function defaultApiUrl(env: NodeJS.ProcessEnv): string {
  return env.API_URL ?? `http://127.0.0.1:${env.PORT ?? '3000'}`;
}
export function defaultMqttUrl(env: NodeJS.ProcessEnv): string {
  return env.MQTT_URL ?? `mqtt://${env.MQTT_HOST ?? '127.0.0.1'}:${env.MQTT_PORT ?? '1883'}`;
}

export function simArgsSchema(env: NodeJS.ProcessEnv) {
  return z
    .object({
      scenario: ScenarioNameSchema.optional(),
      units: z.string().regex(/^\d+$/, 'must be a whole number').transform(Number).pipe(z.number().int().min(1).max(5000)).optional(),
      speed: SpeedSchema.default(1),
      seed: z.string().min(1).max(200).default('1'),
      api: Url('--api', ['http:', 'https:']).default(defaultApiUrl(env)),
      mqtt: Url('--mqtt', ['mqtt:', 'tcp:']).default(defaultMqttUrl(env)),
      truth: z.string().min(1).optional(),
      start: z.string().refine((s) => !Number.isNaN(Date.parse(s)), 'must be an ISO date and time').transform((s) => Date.parse(s)).optional(),
      'data-dir': z.string().min(1).default(env.DATA_DIR ?? '.data'),
      replay: z.string().min(1).optional(),
      telemetry: z.string().min(1).optional(),
      gateway: z.string().regex(/^[A-Za-z0-9][A-Za-z0-9_-]{0,63}$/, 'is not a valid gateway id').optional(),
      unit: z.string().min(1).optional(),
      quiet: z.literal(true).optional(),
    })
    .strict()
    .superRefine((a, ctx) => {
      if (a.replay === undefined && a.scenario === undefined) ctx.addIssue({ code: 'custom', path: ['scenario'], message: 'give --scenario <name> (weekday, weekend, cold-snap, coverage-gaps, demo) or --replay <candump.log>' });
      if (a.replay !== undefined && a.scenario !== undefined) ctx.addIssue({ code: 'custom', path: ['replay'], message: '--replay and --scenario do not go together' });
      if (a.replay !== undefined && a.gateway === undefined) ctx.addIssue({ code: 'custom', path: ['gateway'], message: '--replay needs --gateway <id>' });
      if (a.replay === undefined && (a.telemetry !== undefined || a.gateway !== undefined)) ctx.addIssue({ code: 'custom', path: ['telemetry'], message: '--telemetry and --gateway belong to --replay' });
    });
}
export type SimArgs = z.infer<ReturnType<typeof simArgsSchema>>;

export const AdminEnvSchema = z.object({
  ADMIN_EMAIL: z.string({ error: 'ADMIN_EMAIL is not set (the admin the simulator signs in as)' }).min(1),
  ADMIN_PASSWORD: z.string({ error: 'ADMIN_PASSWORD is not set' }).min(1),
});

/** zod issues as lines a person can act on. */
export function describeIssues(err: z.ZodError): string {
  return err.issues.map((i) => {
    if (i.code === 'unrecognized_keys') return `unknown option ${i.keys.map((k) => `--${k}`).join(', ')}`;
    const where = i.path.length > 0 ? `--${i.path.join('.')}` : '';
    return `${where} ${i.message}`.trim();
  }).join('\n');
}
