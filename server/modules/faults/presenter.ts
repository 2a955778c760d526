import { describeFmi } from '../../../shared/j1939/fmi';
import type { FaultRecord } from './service';

export const presentFault = (f: FaultRecord) => ({
  id: Number(f.id),
  unitId: f.unit_id,
  at: f.at.toISOString(),
  sourceAddress: f.source_address,
  spn: f.spn,
  fmi: f.fmi,
  fmiText: describeFmi(f.fmi),
  // SAE J1939-73: conversion method 1 means the SPN bytes follow an older layout and may be misread.
  spnUncertain: f.conversion_method === 1,
  occurrenceCount: f.occurrence_count,
  lamps: { mil: f.lamps.mil, redStop: f.lamps.redStop, amberWarning: f.lamps.amberWarning, protect: f.lamps.protect },
  episodeId: f.episode_id === null ? null : Number(f.episode_id),
});
