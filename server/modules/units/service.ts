import { UniqueConstraintError } from 'sequelize';
import { Unit } from '../../db/models/unit';
import { Gateway } from '../../db/models/gateway';
import { conflict, notFound } from '../../lib/errors';
import type { AuthUser } from '../../lib/middleware';
import { recordAudit } from '../audit/service';
import { DEFAULT_PURGE_SECONDS, defaultLossThresholdV } from '../../../shared/protocol/limits';
import type { UnitCreate, UnitUpdate } from '../../../shared/api/units';

export type UnitWithGateway = Unit & { gateways?: Gateway[] };

const activeGateway = { model: Gateway, as: 'gateways', where: { revokedAt: null }, required: false };

export async function listUnits(): Promise<UnitWithGateway[]> {
  return Unit.findAll({ include: [activeGateway], order: [['id', 'ASC']] });
}

export async function getUnit(id: string): Promise<UnitWithGateway> {
  const unit = await Unit.findByPk(id, { include: [activeGateway] });
  if (!unit) throw notFound(`Unit ${id}`);
  return unit;
}

export async function createUnit(actor: AuthUser | null, input: UnitCreate) {
  try {
    await Unit.create({
      id: input.id,
      name: input.name,
      depot: input.depot,
      systemVoltage: input.systemVoltage,
      purgeSeconds: input.purgeSeconds ?? DEFAULT_PURGE_SECONDS,
      lossThresholdV: input.lossThresholdV ?? defaultLossThresholdV(input.systemVoltage),
      linkSpns: input.linkSpns ?? null,
    });
  } catch (err) {
    if (err instanceof UniqueConstraintError) throw conflict(`Unit ${input.id} already exists`);
    throw err;
  }
  await recordAudit(actor, 'unit.create', `unit:${input.id}`, { ...input });
  return getUnit(input.id);
}

export async function updateUnit(actor: AuthUser, id: string, input: UnitUpdate) {
  const unit = await getUnit(id);
  const before = { name: unit.name, depot: unit.depot, systemVoltage: unit.systemVoltage, purgeSeconds: unit.purgeSeconds, lossThresholdV: unit.lossThresholdV, linkSpns: unit.linkSpns };
  await unit.update(input);
  await recordAudit(actor, 'unit.update', `unit:${id}`, { before, after: input });
  return getUnit(id);
}
