// A gateway may subscribe only to its own indicator topic, exactly, no wildcards (protocol).
import type { Client, Subscription } from 'aedes';
import { indicatorTopic } from '../../shared/protocol/topics';
import type { BrokerCounters } from '../types';

export function createAuthorizeSubscribe(counters: BrokerCounters, onRefuse: (id: string, reason: string) => void) {
  return (client: Client, sub: Subscription, callback: (err: Error | null, sub?: Subscription | null) => void) => {
    if ((client as Client & { isService?: boolean }).isService) return callback(null, sub);
    if (sub.topic === indicatorTopic(client.id)) return callback(null, sub);
    counters.subscribeRefused++;
    onRefuse(client.id, `subscription to ${sub.topic.slice(0, 200)} refused`);
    callback(null, null); // SUBACK return code 0x80
  };
}
