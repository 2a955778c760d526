// gateway id -> the unit it serves and its stream number, cached; the database is the source of truth.
import { Gateway } from '../db/models/gateway';

export interface GatewayEntry {
  gatewayId: string;
  unitId: string;
  stream: number;
  revoked: boolean;
}

export class GatewayDirectory {
  private byId = new Map<string, GatewayEntry | null>();
  /** unit id -> its gateways' ids (kept beside byId: the indicator asks for every changed unit). */
  private byUnit = new Map<string, Set<string>>();

  async load() {
    this.byId.clear();
    this.byUnit.clear();
    for (const g of await Gateway.findAll()) this.put(this.entry(g));
  }

  /** The cached entry, without a database round trip (the hot path); undefined when not cached. */
  peek(gatewayId: string): GatewayEntry | undefined {
    return this.byId.get(gatewayId) ?? undefined;
  }

  async get(gatewayId: string): Promise<GatewayEntry | null> {
    if (this.byId.has(gatewayId)) return this.byId.get(gatewayId)!;
    const g = await Gateway.findByPk(gatewayId);
    const e = g ? this.entry(g) : null;
    if (e) this.put(e);
    return e;
  }

  /** The unit's gateway that is not revoked, if any. */
  activeGatewayOf(unitId: string): string | null {
    for (const id of this.byUnit.get(unitId) ?? []) {
      const e = this.byId.get(id);
      if (e && !e.revoked) return e.gatewayId;
    }
    return null;
  }

  async refresh(gatewayId?: string) {
    if (!gatewayId) return this.load();
    const old = this.byId.get(gatewayId);
    if (old) this.byUnit.get(old.unitId)?.delete(gatewayId);
    this.byId.delete(gatewayId);
    await this.get(gatewayId);
  }

  private put(e: GatewayEntry) {
    const old = this.byId.get(e.gatewayId);
    if (old && old.unitId !== e.unitId) this.byUnit.get(old.unitId)?.delete(e.gatewayId);
    this.byId.set(e.gatewayId, e);
    let ids = this.byUnit.get(e.unitId);
    if (!ids) this.byUnit.set(e.unitId, (ids = new Set()));
    ids.add(e.gatewayId);
  }

  private entry(g: Gateway): GatewayEntry {
    return { gatewayId: g.gatewayId, unitId: g.unitId, stream: g.stream, revoked: Boolean(g.revokedAt) };
  }
}
