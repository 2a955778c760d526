// Shared steps of the planner's desk tests: users of each role and an interrupted purge with its alert.
import { deflateSync } from 'node:zlib';
import type { TestService } from '../../helpers/service';
import { connectGateway, provision } from '../../helpers/gateway';
import { MessageSeq } from '../../helpers/messages';
import { until } from '../../helpers/until';

export { until };

export async function addUser(t: TestService, admin: string, role: string, email = `${role}@test.local`) {
  const res = await t.api.post('/api/users').set('Authorization', `Bearer ${admin}`).send({ email, name: `The ${role}`, role, password: `${role}-password-1` });
  if (res.status !== 201) throw new Error(`user: ${res.status} ${JSON.stringify(res.body)}`);
  return { id: res.body.id as number, email, token: await t.token(email, `${role}-password-1`) };
}


/** A unit whose purge is cut 12 s in (supply lost) at -14 °C: the alert engine raises an interruptedPurge alert. */
export async function interruptedUnit(t: TestService, admin: string, unit: { id: string; depot?: string; systemVoltage?: 12 | 24 }) {
  const g = await provision(t.api, admin, { ...unit, purgeSeconds: 120 });
  const gw = await connectGateway(t.mqttUrl, g.gatewayId, g.secret);
  const m = new MessageSeq(1);
  const t0 = Date.now() - 60_000;
  const volts = unit.systemVoltage === 24 ? 27.8 : 13.9;
  await gw.publish('telemetry', m.telemetry(t0, 'on', volts, { ambientC: -14 }));
  await gw.publish('telemetry', m.telemetry(t0 + 1000, 'off', volts - 1.2, { ambientC: -14 }));
  await gw.publish('power', m.power(t0 + 13_000, 'supply-lost', 1.2));
  await gw.end();
  const alert = await until(async () => {
    const res = await t.api.get(`/api/alerts?unitId=${unit.id}`).set('Authorization', `Bearer ${admin}`);
    return (res.body as { id: number; kind: string; episodeId: number }[]).find((a) => a.kind === 'interruptedPurge');
  });
  return alert;
}

/** A real PNG (1×1, one grey pixel) built per ISO/IEC 15948: signature, IHDR, IDAT, IEND with CRCs. */
export function tinyPng(): Buffer {
  const crcTable = Array.from({ length: 256 }, (_, n) => {
    let c = n;
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
    return c >>> 0;
  });
  const crc = (buf: Buffer) => {
    let c = 0xffffffff;
    for (const b of buf) c = crcTable[(c ^ b) & 0xff] ^ (c >>> 8);
    return (c ^ 0xffffffff) >>> 0;
  };
  const chunk = (type: string, data: Buffer) => {
    const len = Buffer.alloc(4);
    len.writeUInt32BE(data.length);
    const body = Buffer.concat([Buffer.from(type, 'ascii'), data]);
    const c = Buffer.alloc(4);
    c.writeUInt32BE(crc(body));
    return Buffer.concat([len, body, c]);
  };
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(1, 0);
  ihdr.writeUInt32BE(1, 4);
  ihdr[8] = 8; // bit depth
  ihdr[9] = 0; // greyscale
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk('IHDR', ihdr),
    chunk('IDAT', deflateSync(Buffer.from([0, 0x80]))),
    chunk('IEND', Buffer.alloc(0)),
  ]);
}
