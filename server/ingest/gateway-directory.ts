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

  async load() {
    this.byId.clear();
    for (const g of await Gateway.findAll()) this.byId.set(g.gatewayId, this.entry(g));
  }

  /** The cached entry, without a database round trip (the hot path); undefined when not cached. */
  peek(gatewayId: string): GatewayEntry | undefined {
    return this.byId.get(gatewayId) ?? undefined;
  }

  async get(gatewayId: string): Promise<GatewayEntry | null> {
    if (this.byId.has(gatewayId)) return this.byId.get(gatewayId)!;
    const g = await Gateway.findByPk(gatewayId);
    const e = g ? this.entry(g) : null;
    if (e) this.byId.set(gatewayId, e);
    return e;
  }

  /** The unit's gateway that is not revoked, if any. */
  activeGatewayOf(unitId: string): string | null {
    for (const e of this.byId.values()) if (e && e.unitId === unitId && !e.revoked) return e.gatewayId;
    return null;
  }

  async refresh(gatewayId?: string) {
    if (!gatewayId) return this.load();
    this.byId.delete(gatewayId);
    await this.get(gatewayId);
  }

  private entry(g: Gateway): GatewayEntry {
    return { gatewayId: g.gatewayId, unitId: g.unitId, stream: g.stream, revoked: Boolean(g.revokedAt) };
  }
}
