// The invented fleet: depots, trucks, their drivers' habits and their gateways' quirks.

/** How a driver treats the battery isolator at the end of a shift (common practice is to wait for "safe to isolate"). */
export type DriverHabit = 'waits' | 'hasty' | 'never';

export interface Shift {
  /** Hour of day (UTC) the shift usually starts. */
  startHour: number;
  lengthH: number;
  /** Weekdays worked, 0 = Sunday … 6 = Saturday. */
  days: number[];
}

export interface UnitSpec {
  index: number;
  id: string;
  name: string;
  depot: string;
  systemVoltage: 12 | 24;
  purgeSeconds: number;
  driver: { id: string; habit: DriverHabit };
  shift: Shift;
  /** Resting-voltage sag per parked hour, volts on a 12 V system (parasitic drain differs per truck). */
  sagVPerH: number;
  /** Seconds by which this controller's real purge is shorter than the profile's (0 for most). */
  ecmEarlyS: number;
  hasAmbientSensor: boolean;
  /** Chance that the hold-up reserve fails to get `supply-lost` out when the isolator opens. */
  lossMissP: number;
  /** Parked and powered this long (hours), the gateway goes to deep sleep; null = never sleeps. */
  gatewaySleepAfterH: number | null;
  /** Gateway clock: fixed offset and rate error. */
  clockOffsetMs: number;
  clockPpm: number;
}

export interface GatewayAssignment {
  gatewayId: string;
  /** The boot counter of the first power-up in this run. */
  firstBoot: number;
}
