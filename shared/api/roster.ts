// The fleet roster CSV: one unit per row, with its gateway. Checked row by row and cell by cell.
import { z } from 'zod';

export const ROSTER_COLUMNS = ['unit_id', 'name', 'depot', 'system_voltage', 'purge_seconds', 'gateway_id'] as const;
export type RosterColumn = (typeof ROSTER_COLUMNS)[number];
export const ROSTER_MAX_ROWS = 2000;
/** The CSV as text in a JSON body (the body limit is 1 MB). */
export const RosterUploadSchema = z.object({ csv: z.string().min(1, 'the file is empty').max(900_000, 'the file is larger than 900 kB') }).strict();

export const ROSTER_TEMPLATE = `${ROSTER_COLUMNS.join(',')}\nRT-101,Rigid tipper 101,North yard,24,120,gw-rt-101\nVN-7,Delivery van 7,South yard,12,90,gw-vn-7\n`;

export const RosterCellErrorSchema = z.object({ column: z.enum(ROSTER_COLUMNS).nullable(), message: z.string() });
export const RosterRowSchema = z.object({
  /** The line in the file (the header is line 1). */
  line: z.number(),
  unitId: z.string(),
  name: z.string(),
  depot: z.string(),
  systemVoltage: z.number().nullable(),
  purgeSeconds: z.number().nullable(),
  gatewayId: z.string().nullable(),
  /** The cells as written in the file (trimmed), to show a bad value as it was. */
  cells: z.record(z.enum(ROSTER_COLUMNS), z.string()),
  errors: z.array(RosterCellErrorSchema),
});
export type RosterRow = z.infer<typeof RosterRowSchema>;

export const RosterPreviewSchema = z.object({
  ok: z.boolean(),
  rows: z.array(RosterRowSchema),
  /** Problems of the file as a whole (missing columns, too many rows, unreadable CSV). */
  fileErrors: z.array(z.string()),
  errorCount: z.number(),
});
export type RosterPreview = z.infer<typeof RosterPreviewSchema>;

export const RosterCommitResultSchema = z.object({
  units: z.array(z.string()),
  /** Each new gateway's secret, shown in this response only. */
  gateways: z.array(z.object({ unitId: z.string(), gatewayId: z.string(), secret: z.string() })),
});
export type RosterCommitResult = z.infer<typeof RosterCommitResultSchema>;
