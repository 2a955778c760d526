// /api/drivers: drivers, assignments (form and CSV import), the coaching view.
import { Router } from 'express';
import { z } from 'zod';
import type { AppContext } from '../../lib/context';
import { requirePermission } from '../../lib/middleware';
import {
  AssignmentCreateSchema, AssignmentImportSchema, AssignmentQuerySchema, CoachingQuerySchema, DriverCreateSchema, DriverUpdateSchema,
} from '../../../shared/api/drivers';
import { createAssignment, createDriver, deleteAssignment, getDriver, listAssignments, listDrivers, updateDriver } from './service';
import { presentAssignment, presentDriver } from './presenter';
import { ASSIGNMENT_TEMPLATE, importAssignments } from './assignment-import';
import { coaching } from './coaching';

const IdParam = z.coerce.number().int().positive();

export function driverRoutes(ctx: AppContext) {
  const r = Router();
  const db = ctx.sequelize;
  r.get('/', requirePermission('drivers.read'), async (_req, res) => {
    res.json((await listDrivers(db)).map(presentDriver));
  });
  r.post('/', requirePermission('drivers.manage'), async (req, res) => {
    res.status(201).json(presentDriver(await createDriver(db, req.user!, DriverCreateSchema.parse(req.body))));
  });

  r.get('/assignments', requirePermission('drivers.read'), async (req, res) => {
    res.json((await listAssignments(db, AssignmentQuerySchema.parse(req.query))).map(presentAssignment));
  });
  r.get('/assignments/template.csv', requirePermission('drivers.read'), (_req, res) => {
    res.setHeader('Content-Type', 'text/csv; charset=utf-8');
    res.setHeader('Content-Disposition', 'attachment; filename="driver-assignments-template.csv"');
    res.send(ASSIGNMENT_TEMPLATE);
  });
  r.post('/assignments', requirePermission('drivers.manage'), async (req, res) => {
    res.status(201).json(presentAssignment(await createAssignment(db, req.user!, AssignmentCreateSchema.parse(req.body))));
  });
  r.post('/assignments/import', requirePermission('drivers.manage'), async (req, res) => {
    const body = AssignmentImportSchema.parse(req.body);
    res.json(await importAssignments(db, req.user!, body.csv, body.commit));
  });
  r.delete('/assignments/:id', requirePermission('drivers.manage'), async (req, res) => {
    await deleteAssignment(db, req.user!, IdParam.parse(req.params.id));
    res.status(204).end();
  });

  r.get('/:id', requirePermission('drivers.read'), async (req, res) => {
    res.json(presentDriver(await getDriver(db, IdParam.parse(req.params.id))));
  });
  r.patch('/:id', requirePermission('drivers.manage'), async (req, res) => {
    res.json(presentDriver(await updateDriver(db, req.user!, IdParam.parse(req.params.id), DriverUpdateSchema.parse(req.body))));
  });
  r.get('/:id/coaching', requirePermission('reports.read'), async (req, res) => {
    res.json(await coaching(db, IdParam.parse(req.params.id), CoachingQuerySchema.parse(req.query).weeks));
  });
  return r;
}
