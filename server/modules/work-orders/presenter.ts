import { COIL_BAND_SOURCE, COIL_RESISTANCE_BANDS } from '../../../shared/checks/coil-resistance';
import type { CheckView, PhotoView, WorkOrderView } from '../../../shared/api/work-orders';

export interface WorkOrderRow {
  id: string; unit_id: string; unit_name: string; depot: string; system_voltage: number; source_kind: WorkOrderView['source']['kind'];
  alert_id: string | null; episode_id: string | null; fault_id: string | null; title: string; status: WorkOrderView['status'];
  assignee_id: number | null; assignee_email: string | null; assignee_name: string | null; outcome: WorkOrderView['outcome'];
  outcome_note: string | null; created_by_email: string | null; created_at: Date; updated_at: Date; closed_at: Date | null; closed_by_email: string | null;
}
export interface CheckRow {
  check_key: CheckView['key']; verdict: CheckView['verdict']; ohms: number | null; system_voltage: number | null; note: string | null; recorded_by_email: string | null; recorded_at: Date;
}
export interface PhotoRow {
  id: string; work_order_id: string; original_name: string; mime: string; size_bytes: number; uploaded_by_email: string | null; uploaded_at: Date;
}

const num = (v: string | null) => (v === null ? null : Number(v));

export function presentCheck(c: CheckRow): CheckView {
  const band = c.check_key === 'coilResistance' && (c.system_voltage === 12 || c.system_voltage === 24) ? COIL_RESISTANCE_BANDS[c.system_voltage] : null;
  return {
    key: c.check_key, verdict: c.verdict, ohms: c.ohms, systemVoltage: c.system_voltage,
    band: band && { minOhms: band.minOhms, maxOhms: band.maxOhms, source: COIL_BAND_SOURCE },
    note: c.note, recordedBy: c.recorded_by_email, recordedAt: c.recorded_at.toISOString(),
  };
}

export function presentPhoto(p: PhotoRow): PhotoView {
  return {
    id: Number(p.id), originalName: p.original_name, mime: p.mime, sizeBytes: p.size_bytes, uploadedBy: p.uploaded_by_email,
    uploadedAt: p.uploaded_at.toISOString(), url: `/api/work-orders/${p.work_order_id}/photos/${p.id}`,
  };
}

export function presentWorkOrder(w: WorkOrderRow, checks: CheckRow[], photos: PhotoRow[]): WorkOrderView {
  return {
    id: Number(w.id), unitId: w.unit_id, unitName: w.unit_name, depot: w.depot, systemVoltage: w.system_voltage,
    source: { kind: w.source_kind, alertId: num(w.alert_id), episodeId: num(w.episode_id), faultId: num(w.fault_id) },
    title: w.title, status: w.status,
    assignee: w.assignee_id === null ? null : { id: w.assignee_id, email: w.assignee_email ?? '', name: w.assignee_name ?? '' },
    outcome: w.outcome, outcomeNote: w.outcome_note, createdBy: w.created_by_email, createdAt: w.created_at.toISOString(),
    updatedAt: w.updated_at.toISOString(), closedAt: w.closed_at ? w.closed_at.toISOString() : null, closedBy: w.closed_by_email,
    checks: checks.map(presentCheck), photos: photos.map(presentPhoto),
  };
}
