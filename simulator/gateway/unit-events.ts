import { MINUTE, SECOND } from '../core/time';
import { rechargeAfter } from '../model/electrical';
import type { SimEvent } from './sim-context';
import type { UnitSim } from './unit-sim';
import { collapsedSupply } from './readings';

type Handler<T extends SimEvent['type']> = (s: UnitSim, e: Extract<SimEvent, { type: T }>) => void;

const onStart: Handler<'start'> = (s) => {
  if (!s.isolatorOpen) s.bootUp();
};

const onPreKeyOn: Handler<'preKeyOn'> = (s) => {
  if (s.ending || !s.isolatorOpen) return;
  s.isolatorOpen = false;
  // Supply back: the gateway powers up, unless the scenario has not started yet.
  if (s.t >= s.ctx.start) s.bootUp();
};

const onKeyOn: Handler<'keyOn'> = (s, e) => {
  if (s.ending) return;
  if (s.isolatorOpen) s.isolatorOpen = false; // closed on the way in (the lead was shorter than a step)
  s.keyOn = true;
  s.ecmAwake = true;
  s.ecmToken++;
  s.parkToken++;
  s.battery.startedAt = s.t;
  s.battery.stoppedAt = null;
  const p = s.purge;
  if (p && !p.physicalDone) {
    p.truth.outcome = 'resumed';
    p.physicalDone = true;
  }
  if (s.t < s.ctx.start) return;
  if (s.gw === 'on') s.sample();
  else s.bootUp(); // the gateway wakes with the ignition
  scheduleFaults(s, e.off);
};

function scheduleFaults(s: UnitSim, off: number): void {
  const pending = s.pendingAfterInterrupt;
  s.pendingAfterInterrupt = null;
  if (pending && s.rng.chance(0.85)) {
    const at = s.t + s.rng.float(3, 40) * SECOND;
    const until = Math.min(at + s.rng.float(2, 10) * MINUTE, off - 10 * SECOND);
    if (until > at) s.queue.push({ at, type: 'faultStart', purge: true, linkedKeyOffAt: pending.keyOffAt, until });
  }
  // Unrelated faults start well after the 10-minute link window of any key-on (protocol rule 10).
  const earliest = s.t + 12 * MINUTE;
  if (off - earliest > 3 * MINUTE && s.rng.chance(s.ctx.otherFaultP)) {
    const at = s.rng.float(earliest, off - 2 * MINUTE);
    s.queue.push({ at, type: 'faultStart', purge: false, linkedKeyOffAt: null, until: Math.min(at + s.rng.float(1, 20) * MINUTE, off - 10 * SECOND) });
  }
}

const onKeyOff: Handler<'keyOff'> = (s, e) => {
  if (s.ending) return;
  const t = s.t;
  s.captureFrames(s.bus.clearAll(t));
  s.flushCan(t);
  s.keyOn = false;
  if (s.battery.startedAt !== null) s.battery.restV = rechargeAfter(s.battery.restV, t - s.battery.startedAt);
  s.battery.stoppedAt = t;
  const u = s.unit;
  const token = ++s.ecmToken;
  const ecmAfterS = u.ecmEarlyS > 0 ? u.purgeSeconds - u.ecmEarlyS : u.purgeSeconds + s.rng.float(0.2, 3);
  s.queue.push({ at: t + ecmAfterS * SECOND, type: 'ecmSleep', token });
  if (e.isolation) {
    const iso = e.isolation;
    s.queue.push({ at: iso.openAt, type: 'isoOpen', how: iso.how, bounceMs: iso.bounceMs });
    if (iso.reopenAt !== null) s.queue.push({ at: iso.reopenAt, type: 'isoOpen', how: 'afterSafe', bounceMs: null });
  }
  if (s.gw !== 'on') {
    s.purge = null;
    return;
  }
  s.sample(); // the key-off sample (protocol rule 1: not itself evidence)
  const keyOffTs = s.outbox.clockMs(t);
  const keyOffAt = new Date(keyOffTs).toISOString();
  const p = {
    truth: {
      unitId: u.id, gatewayId: s.outbox.gatewayId, boot: s.outbox.boot, keyOffAt, trueKeyOffAt: new Date(t).toISOString(),
      purgeSeconds: u.purgeSeconds,
      isolator: { opened: false, how: 'none' as const, at: null, secondsAfterKeyOff: null, lossReported: null },
      outcome: 'completed' as const, secondsIntoPurge: null, ambientC: s.lastAmbientC,
    },
    boot: s.outbox.boot, keyOffTs, cTs: keyOffTs + u.purgeSeconds * SECOND, cTrue: t + u.purgeSeconds * SECOND,
    evidence: { observed: false }, evidenceOpen: true, physicalDone: false,
  };
  s.purge = p as typeof s.purge;
  s.keyOffs.push(s.purge!);
  s.queue.push({ at: p.cTrue, type: 'purgeEnd' });
};

const onIsoOpen: Handler<'isoOpen'> = (s, e) => {
  if (s.isolatorOpen || s.keyOn) return;
  const p = s.purge;
  const inPurge = p !== null && !p.physicalDone;
  if (s.ending && !inPurge) return;
  const t = s.t;
  s.isolatorOpen = true;
  s.ecmAwake = false;
  s.ecmToken++;
  let reported: boolean | null = null;
  if (s.gw === 'on') {
    // The hold-up reserve usually gets `supply-lost` out; a bounce is short enough never to lose it.
    reported = e.bounceMs !== null || !s.rng.chance(s.unit.lossMissP);
    const ev = p && p.evidenceOpen && p.boot === s.outbox.boot && reported ? p.evidence : undefined;
    if (ev && p) p.evidenceOpen = false;
    if (reported) s.outbox.publish(t, 'power', { event: 'supply-lost', supplyV: collapsedSupply(s.rng, s.unit) }, ev);
  }
  if (p && p.truth.isolator.how === 'none' && p.boot === s.outbox.boot) {
    const tsMs = s.outbox.clockMs(t);
    p.truth.isolator = {
      opened: true, how: e.bounceMs !== null ? 'bounced' : e.how, at: new Date(tsMs).toISOString(),
      secondsAfterKeyOff: (tsMs - p.keyOffTs) / 1000, lossReported: reported,
    };
    if (inPurge) {
      p.truth.outcome = 'interrupted';
      p.truth.secondsIntoPurge = (tsMs - p.keyOffTs) / 1000;
      p.physicalDone = true;
      s.pendingAfterInterrupt = { keyOffAt: p.truth.keyOffAt };
    }
  }
  if (e.bounceMs !== null && s.gw === 'on') {
    s.queue.push({ at: t + e.bounceMs, type: 'isoBounceEnd' });
    return;
  }
  if (s.gw === 'on') {
    // Flash written but radio lost: half the time the next boot still knows why it went down.
    s.shutDown(reported || s.rng.chance(0.5) ? 'supply-lost' : null);
  } else if (s.gw === 'sleep') {
    s.gw = 'off'; // asleep already: the record stays "sleep"
  }
};

const onIsoBounceEnd: Handler<'isoBounceEnd'> = (s) => {
  s.isolatorOpen = false;
  if (s.gw !== 'on') return;
  const supplyV = Math.round(s.unit.systemVoltage * 1.04 * 100) / 100;
  s.outbox.publish(s.t, 'power', { event: 'supply-restored', supplyV });
};

const onEcmSleep: Handler<'ecmSleep'> = (s, e) => {
  if (e.token !== s.ecmToken || s.keyOn) return;
  s.ecmAwake = false;
  const h = s.unit.gatewaySleepAfterH;
  if (h !== null) s.queue.push({ at: s.t + h * 60 * MINUTE, type: 'gwSleep', token: s.parkToken });
};

const onGwSleep: Handler<'gwSleep'> = (s, e) => {
  if (e.token !== s.parkToken || s.gw !== 'on' || s.keyOn || s.ecmAwake) return;
  s.shutDown('sleep');
};

const onPurgeEnd: Handler<'purgeEnd'> = (s) => {
  const p = s.purge;
  if (p && !p.physicalDone && s.t >= p.cTrue) p.physicalDone = true;
};

const onWatchdog: Handler<'watchdog'> = (s) => {
  if (s.ending || s.gw !== 'on' || !s.keyOn) return;
  s.shutDown('watchdog');
  s.queue.push({ at: s.t + s.rng.float(8, 25) * SECOND, type: 'watchdogBoot' });
};

const onWatchdogBoot: Handler<'watchdogBoot'> = (s) => {
  if (s.gw === 'off' && !s.isolatorOpen) s.bootUp();
};

const onGap: Handler<'gap'> = (s, e) => {
  s.gapDepth += e.begins ? 1 : -1;
  s.outbox.setCoverage(s.t, s.gapDepth === 0);
};

const onFaultStart: Handler<'faultStart'> = (s, e) => {
  if (s.ending || !s.keyOn) return;
  const linked = e.purge && e.linkedKeyOffAt !== null ? e.linkedKeyOffAt : null;
  const dtcs = e.purge ? s.bus.raisePurgeFaults(linked) : s.bus.raiseOtherFault();
  if (dtcs.length === 0) return;
  s.startDm1();
  s.queue.push({ at: e.until, type: 'faultEnd', dtcs });
};

const onFaultEnd: Handler<'faultEnd'> = (s, e) => {
  if (!s.keyOn) return;
  s.captureFrames(s.bus.clear(s.t, e.dtcs));
};

const HANDLERS: { [K in SimEvent['type']]: Handler<K> } = {
  start: onStart, preKeyOn: onPreKeyOn, keyOn: onKeyOn, keyOff: onKeyOff, isoOpen: onIsoOpen, isoBounceEnd: onIsoBounceEnd,
  ecmSleep: onEcmSleep, gwSleep: onGwSleep, purgeEnd: onPurgeEnd, watchdog: onWatchdog, watchdogBoot: onWatchdogBoot,
  gap: onGap, faultStart: onFaultStart, faultEnd: onFaultEnd,
};

export function handleEvent(s: UnitSim, e: SimEvent): void {
  (HANDLERS[e.type] as Handler<typeof e.type>)(s, e as never);
}
