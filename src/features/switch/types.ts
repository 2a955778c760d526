import { z } from 'zod';
import { IndicatorViewSchema } from '../../../shared/realtime/envelope';

// GET /api/switch/:token (public) and the admin's /api/switch-pages (server/modules/switch/routes.ts).
export const SwitchPageSchema = z.object({
  unit: z.object({ id: z.string(), name: z.string(), depot: z.string(), purgeSeconds: z.number() }),
  indicator: IndicatorViewSchema,
  sentAt: z.string(),
});
/** `receivedAt`: when the browser got the indicator, for the countdown. */
export type SwitchPage = z.infer<typeof SwitchPageSchema> & { receivedAt: number };

export const IssuedSwitchPageSchema = z.object({ unitId: z.string(), token: z.string(), path: z.string(), url: z.string() });
export type IssuedSwitchPage = z.infer<typeof IssuedSwitchPageSchema>;

export const SwitchSheetSchema = z.array(z.object({ unitId: z.string(), name: z.string(), depot: z.string(), url: z.string(), qrSvg: z.string() }));
export type SwitchSheetEntry = z.infer<typeof SwitchSheetSchema>[number];
