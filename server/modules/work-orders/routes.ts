import { Router } from 'express';
import { join } from 'node:path';
import { z } from 'zod';
import { requirePermission } from '../../lib/middleware';
import type { AppContext } from '../../lib/context';
import { CheckRecordSchema, WorkOrderAssignSchema, WorkOrderCloseSchema, WorkOrderCreateSchema, WorkOrderListQuerySchema } from '../../../shared/api/work-orders';
import { addPhoto, assertAssignee, assignWorkOrder, closeWorkOrder, createWorkOrder, findPhoto, getWorkOrder, listTechnicians, listWorkOrders, recordCheck } from './service';
import { receivePhoto, storePhoto, uploadsDir } from './photos';

const Id = z.object({ id: z.coerce.number().int().positive() });
const PhotoId = z.object({ id: z.coerce.number().int().positive(), photoId: z.coerce.number().int().positive() });

export function workOrderRoutes(ctx: AppContext) {
  const r = Router();
  const db = ctx.sequelize;
  r.get('/', requirePermission('workOrders.read'), async (req, res) => {
    res.json(await listWorkOrders(db, WorkOrderListQuerySchema.parse(req.query)));
  });
  r.get('/technicians', requirePermission('workOrders.manage'), async (_req, res) => {
    res.json(await listTechnicians(db));
  });
  r.get('/:id', requirePermission('workOrders.read'), async (req, res) => {
    res.json(await getWorkOrder(db, Id.parse(req.params).id));
  });
  r.post('/', requirePermission('workOrders.manage'), async (req, res) => {
    res.status(201).json(await createWorkOrder(db, req.user!, WorkOrderCreateSchema.parse(req.body)));
  });
  r.post('/:id/assign', requirePermission('workOrders.manage'), async (req, res) => {
    res.json(await assignWorkOrder(db, req.user!, Id.parse(req.params).id, WorkOrderAssignSchema.parse(req.body).assigneeId));
  });
  r.post('/:id/close', requirePermission('workOrders.manage'), async (req, res) => {
    res.json(await closeWorkOrder(db, req.user!, Id.parse(req.params).id, WorkOrderCloseSchema.parse(req.body)));
  });
  r.post('/:id/checks', requirePermission('workOrders.record'), async (req, res) => {
    res.json(await recordCheck(db, req.user!, Id.parse(req.params).id, CheckRecordSchema.parse(req.body)));
  });
  // The assignee is checked before the file is read, so nobody else's upload is ever stored.
  r.post(
    '/:id/photos',
    requirePermission('workOrders.record'),
    async (req, _res, next) => {
      try {
        await assertAssignee(db, req.user!, Id.parse(req.params).id);
        next();
      } catch (err) {
        next(err);
      }
    },
    receivePhoto,
    async (req, res) => {
      const id = Id.parse(req.params).id;
      const stored = await storePhoto(ctx.config.DATA_DIR, req.file);
      res.status(201).json(await addPhoto(db, req.user!, id, stored));
    },
  );
  // Served only behind the token check (this router is mounted there), never as a public file.
  r.get('/:id/photos/:photoId', requirePermission('workOrders.read'), async (req, res) => {
    const { id, photoId } = PhotoId.parse(req.params);
    const photo = await findPhoto(db, id, photoId);
    res.setHeader('Content-Type', photo.mime);
    res.setHeader('X-Content-Type-Options', 'nosniff');
    res.setHeader('Cache-Control', 'private, max-age=3600');
    res.sendFile(join(uploadsDir(ctx.config.DATA_DIR), photo.stored_name));
  });
  return r;
}
