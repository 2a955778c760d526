import { GATEWAY_ID_PATTERN, TOPIC_ROOT } from './limits';

export const UPLINK_KINDS = ['telemetry', 'can', 'power', 'status'] as const;
export type UplinkKind = (typeof UPLINK_KINDS)[number];

export const uplinkTopic = (gatewayId: string, kind: UplinkKind) => `${TOPIC_ROOT}/${gatewayId}/${kind}`;
export const indicatorTopic = (gatewayId: string) => `${TOPIC_ROOT}/${gatewayId}/indicator`;
export interface ParsedTopic {
  gatewayId: string;
  kind: UplinkKind | 'indicator';
}

/** Recently parsed good topics: every message names one of a few topics per gateway, and is parsed twice (broker, ingest). */
const parsed = new Map<string, Readonly<ParsedTopic>>();
const PARSED_MAX = 100_000;

/** Splits `afterwatch/v1/gw/{id}/{kind}`; null for anything else. The result is shared: do not change it. */
export function parseTopic(topic: string): Readonly<ParsedTopic> | null {
  const known = parsed.get(topic);
  if (known) return known;
  const p = splitTopic(topic);
  if (p) {
    if (parsed.size >= PARSED_MAX) parsed.clear();
    parsed.set(topic, p);
  }
  return p;
}

function splitTopic(topic: string): ParsedTopic | null {
  const prefix = `${TOPIC_ROOT}/`;
  if (!topic.startsWith(prefix)) return null;
  const rest = topic.slice(prefix.length).split('/');
  if (rest.length !== 2) return null;
  const [gatewayId, kind] = rest;
  if (!GATEWAY_ID_PATTERN.test(gatewayId)) return null;
  if (kind !== 'indicator' && !(UPLINK_KINDS as readonly string[]).includes(kind)) return null;
  return { gatewayId, kind: kind as ParsedTopic['kind'] };
}
