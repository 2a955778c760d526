// Behind an external Mosquitto, the service keeps its password and ACL files from the gateways table
// and asks it to reload them (SIGHUP) after each change.
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

export async function passwordText(serviceUser: string, servicePassword: string): Promise<string> {
  const gateways = await Gateway.findAll({ where: { revokedAt: null }, order: [['gatewayId', 'ASC']] });
  const lines = [`${serviceUser}:${brokerPasswordHash(servicePassword)}`];
  for (const g of gateways) if (g.brokerHash) lines.push(`${g.gatewayId}:${g.brokerHash}`);
  return `${lines.join('\n')}\n`;
}

const writeAtomically = (file: string, text: string, mode: number) => {
  writeFileSync(`${file}.tmp`, text, { mode });
  renameSync(`${file}.tmp`, file);
};

/** Writes `passwd` and `acl` into dir and signals the broker whose pid file is there, if it runs. */
export async function writeMosquittoFiles(dir: string, serviceUser: string, servicePassword: string) {
  mkdirSync(dir, { recursive: true });
  writeAtomically(join(dir, 'passwd'), await passwordText(serviceUser, servicePassword), 0o644);
  writeAtomically(join(dir, 'acl'), aclText(serviceUser), 0o644);
  const pidFile = join(dir, 'mosquitto.pid');
  if (existsSync(pidFile)) {
    const pid = Number(readFileSync(pidFile, 'utf8').trim());
    if (pid > 0) {
      try {
        process.kill(pid, 'SIGHUP');
      } catch {
        /* not running: it reads the files when it starts */
      }
    }
  }
}
