import type { GatewayAssignment, UnitSpec } from '../model/fleet-types';
import { defaultAssignment } from '../scenario/fleet-sim';
import { ApiError, type ApiClient, type ApiUnit } from './api-client';
import { loadGatewayStore, saveGatewayStore, type StoredGateway } from './gateway-store';

export interface ProvisionedGateway extends GatewayAssignment {
  unitId: string;
  secret: string;
}

/** Runs `fn` over `items`, at most `limit` at a time. */
async function eachLimited<T>(items: readonly T[], limit: number, fn: (item: T) => Promise<void>): Promise<void> {
  let next = 0;
  const worker = async (): Promise<void> => {
    while (next < items.length) await fn(items[next++]);
  };
  await Promise.all(Array.from({ length: Math.min(limit, items.length) }, worker));
}

async function ensureUnit(api: ApiClient, u: UnitSpec, existing: ApiUnit | undefined): Promise<void> {
  const profile = { systemVoltage: u.systemVoltage, purgeSeconds: u.purgeSeconds };
  if (!existing) {
    try {
      await api.createUnit({ id: u.id, name: u.name, depot: u.depot, ...profile });
      return;
    } catch (err) {
      if (!(err instanceof ApiError && err.status === 409)) throw err; // 409: already there, fine
    }
  }
  // Keep the profile the simulation assumes (a change applies to new purges only).
  if (!existing || existing.systemVoltage !== u.systemVoltage || existing.purgeSeconds !== u.purgeSeconds) {
    await api.updateUnit(u.id, profile);
  }
}

async function newGateway(api: ApiClient, unitId: string, previous: string | undefined): Promise<{ gatewayId: string; secret: string }> {
  const m = previous ? /-gw(\d+)$/.exec(previous) : null;
  let n = m ? Number(m[1]) + 1 : 1;
  for (let tries = 0; tries < 100; tries++, n++) {
    try {
      return await api.createGateway(`${unitId}-gw${n}`, unitId);
    } catch (err) {
      if (!(err instanceof ApiError && err.status === 409)) throw err; // that id is taken: try the next
    }
  }
  throw new Error(`no free gateway id for unit ${unitId} after 100 tries`);
}

/**
 * As an admin would: creates the fleet's units (409 = already there), keeps their profiles, and
 * gives each a gateway: the stored one if the service still knows it, else a new one (which
 * replaces the unit's old gateway). Secrets and boot counters are saved to `storePath`.
 */
export async function provisionFleet(api: ApiClient, fleet: readonly UnitSpec[], storePath: string, seed: string): Promise<Map<string, ProvisionedGateway>> {
  const units = new Map((await api.listUnits()).map((u) => [u.id, u]));
  await eachLimited(fleet, 8, (u) => ensureUnit(api, u, units.get(u.id)));
  const store = await loadGatewayStore(storePath);
  const active = new Map((await api.listGateways()).filter((g) => g.revokedAt === null).map((g) => [g.gatewayId, g.unitId]));
  const out = new Map<string, ProvisionedGateway>();
  await eachLimited(fleet, 8, async (u) => {
    const stored = store.get(u.id);
    if (stored && active.get(stored.gatewayId) === u.id) {
      out.set(u.id, { unitId: u.id, gatewayId: stored.gatewayId, secret: stored.secret, firstBoot: stored.nextBoot });
      return;
    }
    const created = await newGateway(api, u.id, stored?.gatewayId);
    const firstBoot = defaultAssignment(seed, u.id).firstBoot;
    store.set(u.id, { gatewayId: created.gatewayId, secret: created.secret, nextBoot: firstBoot });
    out.set(u.id, { unitId: u.id, gatewayId: created.gatewayId, secret: created.secret, firstBoot });
  });
  await saveGatewayStore(storePath, store);
  return out;
}

/** After a run: the next power-up of each gateway continues its boot counter. */
export async function saveNextBoots(storePath: string, nextBoots: ReadonlyMap<string, number>): Promise<void> {
  const store = await loadGatewayStore(storePath);
  for (const [unitId, nextBoot] of nextBoots) {
    const s: StoredGateway | undefined = store.get(unitId);
    if (s) store.set(unitId, { ...s, nextBoot: Math.max(s.nextBoot, nextBoot) });
  }
  await saveGatewayStore(storePath, store);
}
