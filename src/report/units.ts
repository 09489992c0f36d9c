// The units a person reads in tables, reports and human CSVs: metric (km/h, m) or imperial (mph, ft). Results stay
// SI inside the program and in JSON; only the edges convert. Factors are the exact international definitions:
// 1 ft = 0.3048 m and 1 mile = 1609.344 m (international yard and pound agreement, 1959).

export type UnitSystem = 'metric' | 'imperial';

export const UNIT_SYSTEMS: readonly UnitSystem[] = ['metric', 'imperial'];

export const METRES_PER_FOOT = 0.3048;
export const METRES_PER_MILE = 1609.344;

export interface DisplayUnits {
  system: UnitSystem;
  /** Speed label and conversion from m/s. */
  speedLabel: 'km/h' | 'mph';
  speed(speedMps: number): number;
  /** Short distances (braking points, offsets, radii) label and conversion from m. */
  distanceLabel: 'm' | 'ft';
  distance(distanceM: number): number;
  /** Long distances (a lap's length) label and conversion from m. */
  lengthLabel: 'km' | 'mi';
  length(distanceM: number): number;
  /** Column-name suffix of a speed and a distance in a CSV a person reads (`_kph`/`_mph`, `_m`/`_ft`). */
  speedSuffix: 'kph' | 'mph';
  distanceSuffix: 'm' | 'ft';
}

const metric: DisplayUnits = {
  system: 'metric',
  speedLabel: 'km/h',
  speed: (speedMps) => speedMps * 3.6,
  distanceLabel: 'm',
  distance: (distanceM) => distanceM,
  lengthLabel: 'km',
  length: (distanceM) => distanceM / 1000,
  speedSuffix: 'kph',
  distanceSuffix: 'm',
};

const imperial: DisplayUnits = {
  system: 'imperial',
  speedLabel: 'mph',
  speed: (speedMps) => (speedMps * 3600) / METRES_PER_MILE,
  distanceLabel: 'ft',
  distance: (distanceM) => distanceM / METRES_PER_FOOT,
  lengthLabel: 'mi',
  length: (distanceM) => distanceM / METRES_PER_MILE,
  speedSuffix: 'mph',
  distanceSuffix: 'ft',
};

export function displayUnits(system: UnitSystem = 'metric'): DisplayUnits {
  return system === 'imperial' ? imperial : metric;
}

export { plainNumber } from '../units.js';

/** The words for numbers in one unit system: a distance and a speed with their unit, rounded for a sentence. */
export interface Phrasing {
  /** A distance without its sign ('12 m', '39 ft'), whole units unless `digits` says otherwise. */
  distance(distanceM: number, digits?: number): string;
  /** A signed distance ('-4 m'), whole units unless `digits` says otherwise. */
  signedDistance(distanceM: number, digits?: number): string;
  /** A speed without its sign, whole units ('85 km/h', '53 mph'). */
  speed(speedMps: number): string;
  /** A signed speed, whole units. */
  signedSpeed(speedMps: number): string;
}

export function phrasing(units: DisplayUnits = metric): Phrasing {
  return {
    distance: (distanceM, digits = 0) =>
      `${Math.abs(units.distance(distanceM)).toFixed(digits)} ${units.distanceLabel}`,
    signedDistance: (distanceM, digits = 0) => `${units.distance(distanceM).toFixed(digits)} ${units.distanceLabel}`,
    speed: (speedMps) => `${Math.abs(units.speed(speedMps)).toFixed(0)} ${units.speedLabel}`,
    signedSpeed: (speedMps) => `${units.speed(speedMps).toFixed(0)} ${units.speedLabel}`,
  };
}
