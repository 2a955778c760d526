import { z } from 'zod';
import { GATEWAY_ID_PATTERN } from '../../../shared/protocol/limits';

export const GatewaySchema = z.object({
  gatewayId: z.string(),
  unitId: z.string(),
  createdAt: z.string(),
  revokedAt: z.string().nullable(),
  connected: z.boolean(),
  lastSeenAt: z.string().nullable(),
});
export type Gateway = z.infer<typeof GatewaySchema>;

export const ProvisionedGatewaySchema = z.object({ gatewayId: z.string(), secret: z.string().min(1) });
export type ProvisionedGateway = z.infer<typeof ProvisionedGatewaySchema>;

// Gateway protocol v1, transport: gateway ids match this pattern.
export const ProvisionGatewaySchema = z.object({
  gatewayId: z
    .string()
    .trim()
    .regex(GATEWAY_ID_PATTERN, 'Letters, digits, "-" and "_", starting with a letter or digit, at most 64.'),
  unitId: z.string().min(1, 'Choose a unit.'),
});
export type ProvisionGatewayInput = z.infer<typeof ProvisionGatewaySchema>;
