import type { Assignment, Driver } from '../../../shared/api/drivers';

export interface DriverRecord { id: number; code: string; name: string; depot: string | null; active: boolean }
export interface AssignmentRecord { id: string; driver_id: number; driver_code: string; driver_name: string; unit_id: string; from_at: Date; to_at: Date | null }

export const presentDriver = (d: DriverRecord): Driver => ({ id: d.id, code: d.code, name: d.name, depot: d.depot, active: d.active });

export const presentAssignment = (a: AssignmentRecord): Assignment => ({
  id: Number(a.id),
  driverId: a.driver_id,
  driverCode: a.driver_code,
  driverName: a.driver_name,
  unitId: a.unit_id,
  from: a.from_at.toISOString(),
  to: a.to_at ? a.to_at.toISOString() : null,
});
