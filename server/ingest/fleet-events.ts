import { EventEmitter } from 'node:events';
import type { Episode, UnitState } from '../detection/types';
import type { LiveUnitView } from '../lib/context';

export interface UnitChange {
  unitId: string;
  depot: string;
  view: LiveUnitView;
  previous: UnitState | null;
  state: UnitState | null;
}

export interface EpisodeChange {
  unitId: string;
  id: number;
  episode: Episode;
  before: Episode | null;
}

/** What the ingest announces after each commit: unit views that changed, and episodes that changed. */
export interface FleetEvents {
  on(event: 'units', listener: (changes: UnitChange[]) => void): this;
  on(event: 'episodes', listener: (changes: EpisodeChange[]) => void): this;
  emit(event: 'units', changes: UnitChange[]): boolean;
  emit(event: 'episodes', changes: EpisodeChange[]): boolean;
}

export const createFleetEvents = (): FleetEvents => new EventEmitter().setMaxListeners(50) as FleetEvents;
