// A gateway may publish only to its own telemetry, can, power and status topics, at most 64 KiB (protocol).
// The hook runs before aedes writes the PUBACK, so waiting here for the ingest's commit makes PUBACK mean "committed".
import type { Client, PublishPacket } from 'aedes';
import { MAX_PAYLOAD_BYTES } from '../../shared/protocol/limits';
import { parseTopic } from '../../shared/protocol/topics';
import type { Accept, BrokerCounters } from '../types';
import type { ReadGate } from '../read-gate';

export function createAuthorizePublish(accept: Accept, counters: BrokerCounters, onRefuse: (id: string, reason: string) => void, gate?: ReadGate) {
  // Made once, not per message (a closure per publish costs the hot path).
  function refuse(client: Client, callback: (err?: Error | null) => void, reason: string) {
    onRefuse(client.id, reason);
    callback(new Error(reason));
  }
  return (client: Client | null, packet: PublishPacket, callback: (err?: Error | null) => void) => {
    if (!client) return callback(null); // the service's own publishes
    if ((client as Client & { isService?: boolean }).isService) return callback(null);
    const parsed = parseTopic(packet.topic);
    if (!parsed || parsed.gatewayId !== client.id || parsed.kind === 'indicator') {
      counters.publishRefused++;
      return refuse(client, callback, `publish to ${packet.topic.slice(0, 200)} refused`);
    }
    const payload = Buffer.isBuffer(packet.payload) ? packet.payload : Buffer.from(packet.payload);
    if (payload.length > MAX_PAYLOAD_BYTES) {
      counters.oversized++;
      return refuse(client, callback, `payload of ${payload.length} bytes is over ${MAX_PAYLOAD_BYTES}`);
    }
    if (packet.retain) packet.retain = false; // gateways' messages are events, never retained state
    gate?.enter();
    accept(client.id, packet.topic, payload).then(
      () => {
        gate?.leave();
        callback(null);
      },
      (err: Error) => {
        gate?.leave();
        // Not committed: no PUBACK. Closing the connection makes the gateway resend it later.
        counters.acceptFailed++;
        onRefuse(client.id, `not committed: ${err.message}`);
        callback(err);
      },
    );
  };
}
