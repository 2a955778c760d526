// Alerts from the judgement: an interrupted purge, an undetermined one in cold weather, a unit silent during its purge.
import type { Sequelize } from 'sequelize';
import type { Logger } from 'pino';
import type { EpisodeChange, FleetEvents } from '../../ingest/fleet-events';
import { WATCH_AT_OR_BELOW_C } from '../../detection/freeze';
import type { AlertView } from '../../../shared/realtime/envelope';
import { escalateOverdue, raiseAlert, settleAlerts, type AlertKind } from './service';

export interface AlertEngineDeps {
  sequelize: Sequelize;
  events: FleetEvents;
  log: Logger;
  escalateAfterMs: number;
  publish(alert: AlertView): void;
}

const CONTACT_KINDS: AlertKind[] = ['undeterminedCold', 'contactLost'];

export function startAlertEngine(deps: AlertEngineDeps) {
  const { sequelize, log } = deps;
  let chain = Promise.resolve();

  const onChange = async (c: EpisodeChange) => {
    const was = c.before?.outcome ?? null;
    const now = c.episode.outcome;
    if (was === now) return;
    const out: (AlertView | null)[] = [];
    if (now === 'interrupted') {
      out.push(...(await settleAlerts(sequelize, c.id, CONTACT_KINDS, `settled: interrupted (${c.episode.settledBy})`)));
      out.push(await raiseAlert(sequelize, c.unitId, c.id, 'interruptedPurge'));
    } else if (now === 'undetermined') {
      const cold = c.episode.ambientC !== null && c.episode.ambientC <= WATCH_AT_OR_BELOW_C;
      out.push(await raiseAlert(sequelize, c.unitId, c.id, cold ? 'undeterminedCold' : 'contactLost'));
    } else if (now === 'completed' || now === 'resumed') {
      out.push(...(await settleAlerts(sequelize, c.id, [...CONTACT_KINDS, 'interruptedPurge'], `settled: ${now} (${c.episode.settledBy})`)));
    }
    for (const a of out) if (a) deps.publish(a);
  };

  deps.events.on('episodes', (changes) => {
    // In order, one at a time, so that a raise and its settling never race.
    chain = chain.then(async () => {
      for (const c of changes) await onChange(c).catch((err) => log.error({ err, unitId: c.unitId }, 'alert not recorded'));
    });
  });

  const escalation = setInterval(() => {
    chain = chain.then(async () => {
      const escalated = await escalateOverdue(sequelize, deps.escalateAfterMs).catch((err) => (log.warn({ err }, 'escalation check failed'), []));
      for (const a of escalated) deps.publish(a);
    });
  }, Math.min(30_000, Math.max(1000, deps.escalateAfterMs / 4)));
  escalation.unref();

  return {
    idle: () => chain,
    stop: () => clearInterval(escalation),
  };
}
