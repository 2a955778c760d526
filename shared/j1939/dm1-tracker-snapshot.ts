import { z } from 'zod';

// The saved state of a Dm1Tracker, checked when it is read back (it comes from storage, an edge).
const Address = z.number().int().min(0).max(255);
const Count = z.record(z.string(), z.number().int().nonnegative());

const CountsSchema = z.object({
  frames: z.number().int().nonnegative(),
  dm1Messages: z.number().int().nonnegative(),
  activations: z.number().int().nonnegative(),
  refused: Count,
  abandoned: Count,
  ignored: Count,
});
export type TrackerCounts = z.infer<typeof CountsSchema>;

const ActiveSchema = z.object({
  sourceAddress: Address,
  dtcs: z.array(z.object({ spn: z.number().int().min(0).max(524287), fmi: z.number().int().min(0).max(31) })),
});

const BamSessionSchema = z
  .object({
    sourceAddress: Address,
    pgn: z.number().int().min(0).max(0x3ffff),
    size: z.number().int().min(9).max(1785),
    packets: z.number().int().min(2).max(255),
    next: z.number().int().min(1).max(255),
    lastT: z.number().finite(),
    received: z.string().regex(/^(?:[0-9A-F]{2})*$/),
  })
  .refine(
    (b) => b.packets === Math.ceil(b.size / 7) && b.received.length / 2 === (b.next - 1) * 7 && b.received.length / 2 < b.size,
    'open BAM session is not consistent (size, packets, next and received bytes disagree)',
  );

const uniqueSources = (list: { sourceAddress: number }[]) => new Set(list.map((x) => x.sourceAddress)).size === list.length;

export const Dm1TrackerSnapshotSchema = z.object({
  version: z.literal(1),
  active: z.array(ActiveSchema).refine(uniqueSources, 'a source address appears twice'),
  bam: z.array(BamSessionSchema).refine(uniqueSources, 'a source address has two open BAM sessions'),
  counts: CountsSchema,
});
export type Dm1TrackerSnapshot = z.infer<typeof Dm1TrackerSnapshotSchema>;
