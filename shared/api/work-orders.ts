// Work orders: opened from an alert, an episode or a fault; checks, photos, an outcome.
import { z } from 'zod';
import { MAX_RECORDED_OHMS } from '../checks/coil-resistance';

export const WORK_ORDER_STATUSES = ['open', 'inProgress', 'closed'] as const;
export const WORK_ORDER_OUTCOMES = ['repaired', 'noFaultFound', 'partsOrdered', 'referred', 'cancelled'] as const;
export const CHECK_KEYS = ['coilResistance', 'defFreezeDamage', 'isolator', 'indicator'] as const;
export type CheckKey = (typeof CHECK_KEYS)[number];

/** Photos: at most this size, of these types (checked by the file's first bytes, not its name). */
export const PHOTO_MAX_BYTES = 8 * 1024 * 1024;
export const PHOTO_TYPES = ['image/jpeg', 'image/png', 'image/webp'] as const;

const Id = z.number().int().positive();
const Note = z.string().trim().max(2000);

export const WorkOrderCreateSchema = z
  .object({
    source: z.object({ kind: z.enum(['alert', 'episode', 'fault']), id: Id }).strict(),
    title: z.string().trim().min(1).max(200).optional(),
    assigneeId: Id.nullable().optional(),
  })
  .strict();
export type WorkOrderCreate = z.infer<typeof WorkOrderCreateSchema>;

export const WorkOrderAssignSchema = z.object({ assigneeId: Id }).strict();

export const WorkOrderCloseSchema = z.object({ outcome: z.enum(WORK_ORDER_OUTCOMES), note: Note.optional() }).strict();
export type WorkOrderClose = z.infer<typeof WorkOrderCloseSchema>;

const PassFail = z.enum(['pass', 'fail']);
export const CheckRecordSchema = z.discriminatedUnion('key', [
  z.object({ key: z.literal('coilResistance'), ohms: z.number().finite().min(0).max(MAX_RECORDED_OHMS), note: Note.optional() }).strict(),
  z.object({ key: z.literal('defFreezeDamage'), result: PassFail, note: Note.optional() }).strict(),
  z.object({ key: z.literal('isolator'), result: PassFail, note: Note.optional() }).strict(),
  z.object({ key: z.literal('indicator'), result: PassFail, note: Note.optional() }).strict(),
]);
export type CheckRecord = z.infer<typeof CheckRecordSchema>;

export const WorkOrderListQuerySchema = z.object({
  status: z.enum([...WORK_ORDER_STATUSES, 'active']).optional(),
  unitId: z.string().max(64).optional(),
  assigneeId: z.coerce.number().int().positive().optional(),
  limit: z.coerce.number().int().min(1).max(1000).default(200),
});

const Iso = z.string();
const Person = z.object({ id: z.number(), email: z.string(), name: z.string() });

export const CheckViewSchema = z.object({
  key: z.enum(CHECK_KEYS),
  verdict: z.enum(['pass', 'fail', 'low', 'high']),
  ohms: z.number().nullable(),
  systemVoltage: z.number().nullable(),
  /** For the coil: the band it was judged against and where the band comes from. */
  band: z.object({ minOhms: z.number(), maxOhms: z.number(), source: z.string() }).nullable(),
  note: z.string().nullable(),
  recordedBy: z.string().nullable(),
  recordedAt: Iso,
});
export type CheckView = z.infer<typeof CheckViewSchema>;

export const PhotoViewSchema = z.object({ id: z.number(), originalName: z.string(), mime: z.string(), sizeBytes: z.number(), uploadedBy: z.string().nullable(), uploadedAt: Iso, url: z.string() });
export type PhotoView = z.infer<typeof PhotoViewSchema>;

export const WorkOrderViewSchema = z.object({
  id: z.number(),
  unitId: z.string(),
  unitName: z.string(),
  depot: z.string(),
  systemVoltage: z.number(),
  source: z.object({ kind: z.enum(['alert', 'episode', 'fault']), alertId: z.number().nullable(), episodeId: z.number().nullable(), faultId: z.number().nullable() }),
  title: z.string(),
  status: z.enum(WORK_ORDER_STATUSES),
  assignee: Person.nullable(),
  outcome: z.enum(WORK_ORDER_OUTCOMES).nullable(),
  outcomeNote: z.string().nullable(),
  createdBy: z.string().nullable(),
  createdAt: Iso,
  updatedAt: Iso,
  closedAt: Iso.nullable(),
  closedBy: z.string().nullable(),
  checks: z.array(CheckViewSchema),
  photos: z.array(PhotoViewSchema),
});
export type WorkOrderView = z.infer<typeof WorkOrderViewSchema>;

export const TechnicianSchema = Person;
