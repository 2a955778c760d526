import type { LiveUnitView } from '../../lib/context';
import type { UnitWithGateway } from './service';

export function presentUnit(unit: UnitWithGateway, live: LiveUnitView) {
  return {
    id: unit.id,
    name: unit.name,
    depot: unit.depot,
    systemVoltage: Number(unit.systemVoltage),
    purgeSeconds: unit.purgeSeconds,
    lossThresholdV: unit.lossThresholdV,
    linkSpns: unit.linkSpns,
    gatewayId: unit.gateways?.[0]?.gatewayId ?? null,
    state: live.state,
    stateSince: live.stateSince,
    purgeRemainingS: live.purgeRemainingS,
    lastSupplyV: live.lastSupplyV,
    lastAmbientC: live.lastAmbientC,
    lastSeenAt: live.lastSeenAt,
  };
}
