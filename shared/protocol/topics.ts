import { GATEWAY_ID_PATTERN, TOPIC_ROOT } from './limits';

export const UPLINK_KINDS = ['telemetry', 'can', 'power', 'status'] as const;
export type UplinkKind = (typeof UPLINK_KINDS)[number];

export const uplinkTopic = (gatewayId: string, kind: UplinkKind) => `${TOPIC_ROOT}/${gatewayId}/${kind}`;
export const indicatorTopic = (gatewayId: string) => `${TOPIC_ROOT}/${gatewayId}/indicator`;
export interface ParsedTopic {
  gatewayId: string;
  kind: UplinkKind | 'indicator';
}

/** Splits `afterwatch/v1/gw/{id}/{kind}`; null for anything else. */
export function parseTopic(topic: string): ParsedTopic | null {
  const prefix = `${TOPIC_ROOT}/`;
  if (!topic.startsWith(prefix)) return null;
  const rest = topic.slice(prefix.length).split('/');
  if (rest.length !== 2) return null;
  const [gatewayId, kind] = rest;
  if (!GATEWAY_ID_PATTERN.test(gatewayId)) return null;
  if (kind !== 'indicator' && !(UPLINK_KINDS as readonly string[]).includes(kind)) return null;
  return { gatewayId, kind: kind as ParsedTopic['kind'] };
}
