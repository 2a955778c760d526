import { z } from 'zod';

// The part of the service's HTTP API an admin (and so the simulator) uses. Every answer is
// validated; an error answer is turned into an Error that says what the service said.

const ErrorBodySchema = z.object({ error: z.object({ code: z.string(), message: z.string() }) });
const LoginSchema = z.object({ token: z.string().min(1), user: z.object({ role: z.string() }).passthrough() });
export const ApiUnitSchema = z
  .object({ id: z.string(), name: z.string(), depot: z.string(), systemVoltage: z.number(), purgeSeconds: z.number(), gatewayId: z.string().nullable() })
  .passthrough();
export type ApiUnit = z.infer<typeof ApiUnitSchema>;
const GatewaySecretSchema = z.object({ gatewayId: z.string(), secret: z.string().min(1) });
const GatewayRowSchema = z.object({ gatewayId: z.string(), unitId: z.string(), revokedAt: z.string().nullable() }).passthrough();
export const ApiEpisodeSchema = z
  .object({
    id: z.union([z.string(), z.number()]),
    unitId: z.string(),
    keyOffAt: z.string(),
    purgeSeconds: z.number(),
    outcome: z.enum(['pending', 'completed', 'interrupted', 'resumed', 'undetermined']),
    endedAt: z.string().nullable(),
    secondsIntoPurge: z.number().nullable(),
    settledBy: z.string().nullable(),
  })
  .passthrough();
export type ApiEpisode = z.infer<typeof ApiEpisodeSchema>;
export const ApiFaultSchema = z
  .object({ unitId: z.string(), at: z.string(), sourceAddress: z.number(), spn: z.number(), fmi: z.number(), episodeId: z.union([z.string(), z.number()]).nullable() })
  .passthrough();
export type ApiFault = z.infer<typeof ApiFaultSchema>;

export class ApiError extends Error {
  constructor(readonly status: number, readonly code: string, message: string) {
    super(message);
  }
}

export class ApiClient {
  private token: string | null = null;

  constructor(readonly baseUrl: string) {}

  private async call<T>(method: string, path: string, schema: z.ZodType<T>, body?: unknown): Promise<T> {
    const headers: Record<string, string> = { accept: 'application/json' };
    if (body !== undefined) headers['content-type'] = 'application/json';
    if (this.token) headers.authorization = `Bearer ${this.token}`;
    let res: Response;
    try {
      res = await fetch(new URL(path, this.baseUrl), { method, headers, body: body === undefined ? undefined : JSON.stringify(body) });
    } catch (err) {
      throw new ApiError(0, 'unreachable', `cannot reach the service at ${this.baseUrl}: ${(err as Error).message}`);
    }
    const text = await res.text();
    let json: unknown = null;
    try {
      json = text === '' ? null : JSON.parse(text);
    } catch {
      throw new ApiError(res.status, 'bad_response', `${method} ${path}: answer is not JSON (status ${res.status})`);
    }
    if (!res.ok) {
      const e = ErrorBodySchema.safeParse(json);
      throw new ApiError(res.status, e.success ? e.data.error.code : 'http_error', `${method} ${path}: ${res.status} ${e.success ? e.data.error.message : text.slice(0, 200)}`);
    }
    const parsed = schema.safeParse(json);
    if (!parsed.success) throw new ApiError(res.status, 'bad_response', `${method} ${path}: unexpected answer: ${parsed.error.message}`);
    return parsed.data;
  }

  async login(email: string, password: string): Promise<void> {
    const r = await this.call('POST', '/api/auth/login', LoginSchema, { email, password });
    this.token = r.token;
  }

  listUnits(): Promise<ApiUnit[]> {
    return this.call('GET', '/api/units', z.array(ApiUnitSchema));
  }

  createUnit(u: { id: string; name: string; depot: string; systemVoltage: 12 | 24; purgeSeconds: number }): Promise<ApiUnit> {
    return this.call('POST', '/api/units', ApiUnitSchema, u);
  }

  updateUnit(id: string, patch: { systemVoltage?: 12 | 24; purgeSeconds?: number }): Promise<ApiUnit> {
    return this.call('PATCH', `/api/units/${encodeURIComponent(id)}`, ApiUnitSchema, patch);
  }

  listGateways(): Promise<z.infer<typeof GatewayRowSchema>[]> {
    return this.call('GET', '/api/gateways', z.array(GatewayRowSchema));
  }

  createGateway(gatewayId: string, unitId: string): Promise<{ gatewayId: string; secret: string }> {
    return this.call('POST', '/api/gateways', GatewaySecretSchema, { gatewayId, unitId });
  }

  listEpisodes(q: { unitId?: string; from?: string; to?: string } = {}): Promise<ApiEpisode[]> {
    return this.call('GET', `/api/episodes?${new URLSearchParams(q as Record<string, string>)}`, z.array(ApiEpisodeSchema));
  }

  listFaults(q: { unitId?: string; from?: string; to?: string } = {}): Promise<ApiFault[]> {
    return this.call('GET', `/api/faults?${new URLSearchParams(q as Record<string, string>)}`, z.array(ApiFaultSchema));
  }
}
