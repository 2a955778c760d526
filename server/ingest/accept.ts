// accept(gatewayId, topic, payload): the one entry of gateway traffic, for the embedded broker's hook and for
// a subscriber behind an external broker. Resolves once the message is committed or quarantined.
import { parseTopic } from '../../shared/protocol/topics';
import { MAX_PAYLOAD_BYTES } from '../../shared/protocol/limits';
import type { GatewayDirectory } from './gateway-directory';
import type { GroupCommit } from './group-commit';
import type { IngestItem } from './items';
import { excerptOf, parseMessage } from './parse-message';
import type { StatusMessage } from '../../shared/protocol/messages';

export interface IngestCounters {
  accepted: number;
  duplicates: number;
  quarantined: number;
  quarantinedByReason: Record<string, number>;
}

export interface AcceptDeps {
  directory: GatewayDirectory;
  batch: GroupCommit<IngestItem>;
  counters: IngestCounters;
  onStatus(gatewayId: string, status: StatusMessage): void;
  wallNow(): number;
  /** At most this many messages wait for a commit; beyond it, accept() waits (and so does the PUBACK). */
  maxBacklog: number;
}

/** The first words of a reason name its class, for counting ("invalid telemetry", "payload is not JSON"). */
const reasonClass = (reason: string) => reason.split(':')[0].slice(0, 60);

export function createAccept(deps: AcceptDeps) {
  const quarantine = (gatewayId: string | null, topic: string, reason: string, payload: Buffer) => {
    deps.counters.quarantined++;
    const cls = reasonClass(reason);
    deps.counters.quarantinedByReason[cls] = (deps.counters.quarantinedByReason[cls] ?? 0) + 1;
    return deps.batch.add({ type: 'quarantine', gatewayId, topic, reason, excerpt: excerptOf(payload) });
  };

  return async function accept(gatewayId: string, topic: string, payload: Buffer): Promise<void> {
    const t = parseTopic(topic);
    if (!t || t.gatewayId !== gatewayId || t.kind === 'indicator') return quarantine(gatewayId, topic, 'topic is not one of the gateway\'s uplink topics', payload);
    const parsed = parseMessage(t.kind, payload);
    if (!parsed.ok) return quarantine(gatewayId, topic, parsed.reason, payload);
    if (parsed.kind === 'status') {
      deps.onStatus(gatewayId, parsed.status);
      return;
    }
    if (payload.length > MAX_PAYLOAD_BYTES) return quarantine(gatewayId, topic, `payload of ${payload.length} bytes is over ${MAX_PAYLOAD_BYTES}`, payload);
    if (deps.batch.backlog >= deps.maxBacklog) await deps.batch.room(deps.maxBacklog);
    const gw = deps.directory.peek(gatewayId) ?? (await deps.directory.get(gatewayId));
    if (!gw) return quarantine(gatewayId, topic, 'gateway is not provisioned for any unit', payload);
    if (gw.revoked) return quarantine(gatewayId, topic, 'gateway has been revoked', payload);
    parsed.event.stream = gw.stream;
    return deps.batch.add({
      type: 'message',
      gatewayId,
      unitId: gw.unitId,
      stream: gw.stream,
      boot: parsed.boot,
      seq: parsed.seq,
      ts: parsed.ts,
      kind: parsed.kind,
      payload: parsed.payload,
      event: parsed.event,
      frames: parsed.frames,
      receivedAt: deps.wallNow(),
    });
  };
}
