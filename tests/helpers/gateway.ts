// A real gateway for tests: mqtt.js with the protocol's credentials, QoS 1 publishes that resolve on PUBACK.
import mqtt, { type MqttClient } from 'mqtt';
import { indicatorTopic, uplinkTopic, type UplinkKind } from '../../shared/protocol/topics';
import { IndicatorSchema } from '../../shared/protocol/messages';

export interface TestGateway {
  client: MqttClient;
  publish(kind: UplinkKind, payload: object | string | Buffer): Promise<void>;
  end(): Promise<void>;
}

export function connectGateway(url: string, gatewayId: string, secret: string, extra: mqtt.IClientOptions = {}): Promise<TestGateway> {
  return new Promise((resolve, reject) => {
    const client = mqtt.connect(url, { clientId: gatewayId, username: gatewayId, password: secret, clean: false, reconnectPeriod: 0, connectTimeout: 5000, protocolVersion: 4, ...extra });
    client.once('connect', () =>
      resolve({
        client,
        publish: (kind, payload) =>
          new Promise<void>((res, rej) => {
            const body = typeof payload === 'string' || Buffer.isBuffer(payload) ? payload : JSON.stringify(payload);
            client.publish(uplinkTopic(gatewayId, kind), body, { qos: 1 }, (err) => (err ? rej(err) : res()));
          }),
        end: () => new Promise<void>((res) => client.end(true, {}, () => res())),
      }),
    );
    client.once('error', (err) => {
      client.end(true);
      reject(err);
    });
  });
}

export async function provision(api: { post(path: string): any }, token: string, unit: { id: string; systemVoltage?: 12 | 24; purgeSeconds?: number; depot?: string; linkSpns?: number[] }, gatewayId = `gw-${unit.id}`) {
  const u = await api.post('/api/units').set('Authorization', `Bearer ${token}`).send({ name: `Unit ${unit.id}`, depot: unit.depot ?? 'Test depot', systemVoltage: unit.systemVoltage ?? 12, ...unit });
  if (u.status !== 201) throw new Error(`unit: ${u.status} ${JSON.stringify(u.body)}`);
  const g = await api.post('/api/gateways').set('Authorization', `Bearer ${token}`).send({ gatewayId, unitId: unit.id });
  if (g.status !== 201) throw new Error(`gateway: ${g.status} ${JSON.stringify(g.body)}`);
  return { gatewayId, secret: g.body.secret as string };
}

/**
 * A gateway with its light, as one fitted beside an isolator behaves across broker restarts: a persistent
 * session, reconnecting on its own (a refusal too: behind Mosquitto the gateways are held off for a while),
 * subscribing to its own indicator at every connection. `lights` collects the states it was sent.
 */
export function watchLight(url: string, gatewayId: string, secret: string) {
  const lights: string[] = [];
  let connects = 0;
  const client = mqtt.connect(url, { clientId: gatewayId, username: gatewayId, password: secret, clean: false, reconnectPeriod: 200, reconnectOnConnackError: true, protocolVersion: 4 });
  client.on('connect', () => {
    connects++;
    client.subscribe(indicatorTopic(gatewayId), { qos: 1 });
  });
  client.on('error', () => {}); // refused or unreachable while the broker is away: mqtt.js keeps retrying
  client.on('message', (_t, payload) => lights.push(IndicatorSchema.parse(JSON.parse(payload.toString())).state));
  return {
    client,
    lights,
    connects: () => connects,
    telemetry: (body: object) => client.publishAsync(uplinkTopic(gatewayId, 'telemetry'), JSON.stringify(body), { qos: 1 }).then(() => undefined),
    end: () => void client.end(true),
  };
}
