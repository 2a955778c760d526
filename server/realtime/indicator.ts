// Drives the light beside the isolator: the protocol's indicator message, QoS 1 and retained, on every change of readiness.
import type { Logger } from 'pino';
import { indicatorTopic } from '../../shared/protocol/topics';
import { indicatorFor } from '../../shared/protocol/indicator';
import type { UnitStateName } from '../../shared/api/units';
import type { FleetEvents, UnitChange } from '../ingest/fleet-events';
import type { LiveUnitView } from '../lib/context';

export interface IndicatorDeps {
  events: FleetEvents;
  /** The unit's current gateway, if any. */
  gatewayOf(unitId: string): string | null;
  units(): string[];
  view(unitId: string): LiveUnitView;
  publish(topic: string, payload: string): Promise<void>;
  log: Logger;
}

export function startIndicators(deps: IndicatorDeps) {
  const last = new Map<string, string>();

  const send = (unitId: string, view: LiveUnitView, force: boolean) => {
    const state = indicatorFor(view.state as UnitStateName | null);
    const gatewayId = deps.gatewayOf(unitId);
    if (!state || !gatewayId) return;
    // Readiness, not every reading: a new hold for a purge, a hold for a rerun, clear, dark.
    const readiness = `${gatewayId}|${state}|${view.state}|${view.stateSince}`;
    if (!force && last.get(unitId) === readiness) return;
    last.set(unitId, readiness);
    const ts = view.stateSince ?? new Date().toISOString();
    const body = state === 'hold' && view.state === 'purging' ? { state, ts, remainingS: view.purgeRemainingS ?? 0 } : { state, ts };
    deps.publish(indicatorTopic(gatewayId), JSON.stringify(body)).catch((err) => deps.log.warn({ err, unitId }, 'indicator not published'));
  };

  const onUnits = (changes: UnitChange[]) => {
    for (const c of changes) send(c.unitId, c.view, false);
  };
  deps.events.on('units', onUnits);
  // Protocol: the service re-publishes every unit's indicator when it starts.
  const republishAll = () => {
    for (const unitId of deps.units()) send(unitId, deps.view(unitId), true);
  };
  republishAll();
  return { republishAll, resend: (unitId: string) => send(unitId, deps.view(unitId), true) };
}
