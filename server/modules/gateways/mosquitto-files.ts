// Behind an external Mosquitto, the service keeps its password and ACL files from the gateways table
// and asks it to reload them (SIGHUP) after each change.
//
// The gateways' entries are in the password file only while a worker of this service is subscribed.
// Mosquitto 2.0 (Debian 12's 2.0.11, measured) keeps a persistent session and its queue across a restart
// but not its shared subscriptions: what a gateway publishes after the restart and before a worker has
// subscribed again is acknowledged to the gateway and dropped. So the file a Mosquitto starts with holds the
// gateways off, and a worker that has subscribed writes them back and has Mosquitto reload it; meanwhile a
// gateway is refused and keeps its messages to send later.
//
// Several workers write the same files, so one must never undo another's. The file without the gateways is
// written only while no Mosquitto runs from this directory (a running one keeps what it loaded, and the next
// reload it is asked for comes after a write with the gateways), the file with them only while one runs (the
// next start must find them held off), and writes are serialised across workers by the caller (a PostgreSQL
// advisory lock, broker-link.ts). Otherwise a worker that lost only its own connection could write the file
// without the gateways just before another's reload, and Mosquitto would drop them all; or a worker that had
// not yet noticed the broker's end could let them back into the file the next start reads. Whether one runs
// is told by the pid file the written configuration has Mosquitto keep in this directory.
import { existsSync, mkdirSync, readFileSync, renameSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { Gateway } from '../../db/models/gateway';
import { brokerPasswordHash } from './secrets';
import { TOPIC_ROOT } from '../../../shared/protocol/limits';

export function aclText(serviceUser: string): string {
  return [
    '# Written by Afterwatch from the gateways table; changes here are overwritten.',
    `user ${serviceUser}`,
    `topic readwrite ${TOPIC_ROOT}/#`,
    '',
    '# A gateway publishes only under its own id and reads only its own indicator (gateway protocol).',
    ...['telemetry', 'can', 'power', 'status'].map((k) => `pattern write ${TOPIC_ROOT}/%u/${k}`),
    `pattern read ${TOPIC_ROOT}/%u/indicator`,
    '',
  ].join('\n');
}

/** The service's own line, and the gateways' unless they are held off. */
export async function passwordText(serviceUser: string, servicePassword: string, admitGateways: boolean): Promise<string> {
  const lines = [`${serviceUser}:${brokerPasswordHash(servicePassword)}`];
  if (admitGateways) {
    const gateways = await Gateway.findAll({ where: { revokedAt: null }, order: [['gatewayId', 'ASC']] });
    for (const g of gateways) if (g.brokerHash) lines.push(`${g.gatewayId}:${g.brokerHash}`);
  }
  return `${lines.join('\n')}\n`;
}

const writeAtomically = (file: string, text: string, mode: number) => {
  writeFileSync(`${file}.tmp`, text, { mode });
  renameSync(`${file}.tmp`, file);
};

/** The pid of the Mosquitto running from dir (its pid file names a live process), or null. */
export function runningBrokerPid(dir: string): number | null {
  const pidFile = join(dir, 'mosquitto.pid');
  if (!existsSync(pidFile)) return null;
  const pid = Number(readFileSync(pidFile, 'utf8').trim());
  if (!Number.isInteger(pid) || pid <= 0) return null;
  try {
    process.kill(pid, 0);
    return pid;
  } catch (err) {
    // EPERM: it runs, as another user.
    return (err as NodeJS.ErrnoException).code === 'EPERM' ? pid : null;
  }
}

/**
 * What a write did: the gateways let in (and the running broker asked to reload), held off, left in because a
 * broker runs, or not let in because none runs.
 */
export type GateWrite = 'admitted' | 'heldOff' | 'leftWhileRunning' | 'noBrokerRunning';

/**
 * Writes `passwd` and `acl` into dir. With the gateways admitted it writes only while a broker runs from dir
 * (its pid file) and signals it to reload them. Holding them off it writes only while none runs, and answers
 * 'leftWhileRunning' otherwise; the caller tries again once that broker is gone (see the top of this file).
 * Null: nothing written (`stillAdmit` said no).
 */
export async function writeMosquittoFiles(
  dir: string,
  serviceUser: string,
  servicePassword: string,
  opts: { admitGateways: boolean; /** Asked again once the gateways are read, just before the write (the caller may have lost the broker meanwhile). */ stillAdmit?: () => boolean },
): Promise<GateWrite | null> {
  mkdirSync(dir, { recursive: true });
  if (!opts.admitGateways && runningBrokerPid(dir) !== null) return 'leftWhileRunning';
  if (opts.admitGateways && runningBrokerPid(dir) === null) return 'noBrokerRunning';
  const text = await passwordText(serviceUser, servicePassword, opts.admitGateways);
  if (opts.admitGateways && opts.stillAdmit && !opts.stillAdmit()) return null;
  writeAtomically(join(dir, 'passwd'), text, 0o644);
  writeAtomically(join(dir, 'acl'), aclText(serviceUser), 0o644);
  if (!opts.admitGateways) return 'heldOff';
  const pid = runningBrokerPid(dir);
  try {
    if (pid !== null) process.kill(pid, 'SIGHUP');
  } catch {
    /* it has just stopped: the workers that lost it hold the gateways off again */
  }
  return 'admitted';
}

/** A Mosquitto configuration for the documented external-broker path (see README, "Scaling out"). */
export function mosquittoConf(dir: string, opts: { host: string; port: number; runAsRoot: boolean }): string {
  return [
    '# Written by Afterwatch (npm run mosquitto:config). The service keeps passwd and acl up to date.',
    `listener ${opts.port} ${opts.host}`,
    'allow_anonymous false',
    // Each PUBACK to a gateway and each message to a worker goes out at once, not held back by Nagle's algorithm.
    'set_tcp_nodelay true',
    `password_file ${join(dir, 'passwd')}`,
    `acl_file ${join(dir, 'acl')}`,
    // Gateway protocol: payloads of at most 64 KiB; the rest of a PUBLISH (topic, header) fits in the margin.
    'max_packet_size 66000',
    'persistence true',
    `persistence_location ${join(dir, 'data')}/`,
    'autosave_interval 5',
    `pid_file ${join(dir, 'mosquitto.pid')}`,
    'max_queued_messages 100000',
    // Unacknowledged messages in flight to each ingest worker: the workers' backpressure.
    'max_inflight_messages 1000',
    ...(opts.runAsRoot ? ['user root'] : []),
    '',
  ].join('\n');
}
