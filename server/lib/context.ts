// What routes and services share: built once in server/index.ts (or a test) and passed to createApp().
import type { Sequelize } from 'sequelize';
import type { Config } from '../config';

export interface HealthProbe {
  name: 'db' | 'broker';
  check(): Promise<boolean>;
}

export interface LiveUnitView {
  state: string | null;
  stateSince: string | null;
  purgeRemainingS: number | null;
  lastSupplyV: number | null;
  lastAmbientC: number | null;
  lastSeenAt: string | null;
}

export interface FleetView {
  /** The live state of a unit, as the ingest keeps it in memory. */
  unit(unitId: string): LiveUnitView;
  /** Called after a unit's profile or gateway changed. */
  unitChanged?(unitId: string): Promise<void> | void;
  /** Called when a gateway is revoked, so the broker drops its session and cached credential. */
  gatewayRevoked?(gatewayId: string): Promise<void> | void;
  /** Whether a gateway is connected to the broker now. */
  gatewayConnected?(gatewayId: string): boolean;
}

export interface AppContext {
  config: Config;
  sequelize: Sequelize;
  jwtSecret: string;
  health: HealthProbe[];
  fleet: FleetView;
}

export const emptyLiveUnitView: LiveUnitView = {
  state: null, stateSince: null, purgeRemainingS: null, lastSupplyV: null, lastAmbientC: null, lastSeenAt: null,
};
