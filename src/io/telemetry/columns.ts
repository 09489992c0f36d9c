// Which header is which channel: common names with unit suffixes or bracketed units ("speed_kph",
// "Speed [km/h]", "Throttle (%)"), or the user's mapping canonical name -> the file's header.

import { InputError } from '../../errors.js';
import { STANDARD_GRAVITY_MPS2 } from '../../units.js';

export type Quantity =
  | 'time'
  | 'distance'
  | 'speed'
  | 'throttle'
  | 'brake'
  | 'brakePressure'
  | 'steering'
  | 'gear'
  | 'rpm'
  | 'x'
  | 'y'
  | 'lat'
  | 'lon'
  | 'ax'
  | 'ay';

/** A recognised column: its index in the row, what it holds, and the factor to SI (null = decide from the data). */
export interface ColumnBinding {
  quantity: Quantity;
  index: number;
  header: string;
  scale: number | null;
}

/** Canonical names accepted in the mapping, with the quantity and unit factor each implies. */
export const CANONICAL_COLUMNS: Record<string, { quantity: Quantity; scale: number | null }> = {
  time_s: { quantity: 'time', scale: 1 },
  distance_m: { quantity: 'distance', scale: 1 },
  speed_mps: { quantity: 'speed', scale: 1 },
  speed_kph: { quantity: 'speed', scale: 1 / 3.6 },
  throttle: { quantity: 'throttle', scale: null },
  brake: { quantity: 'brake', scale: null },
  brake_pressure_bar: { quantity: 'brakePressure', scale: 1e5 },
  steering_deg: { quantity: 'steering', scale: 1 },
  gear: { quantity: 'gear', scale: 1 },
  rpm: { quantity: 'rpm', scale: 1 },
  x_m: { quantity: 'x', scale: 1 },
  y_m: { quantity: 'y', scale: 1 },
  lat_deg: { quantity: 'lat', scale: 1 },
  lon_deg: { quantity: 'lon', scale: 1 },
  ax_mps2: { quantity: 'ax', scale: 1 },
  ax_g: { quantity: 'ax', scale: STANDARD_GRAVITY_MPS2 },
  ay_mps2: { quantity: 'ay', scale: 1 },
  ay_g: { quantity: 'ay', scale: STANDARD_GRAVITY_MPS2 },
};

const ALIASES: Record<Quantity, string[]> = {
  time: ['time', 't', 'timestamp', 'elapsed', 'elapsed_time', 'session_time', 'time_elapsed'],
  distance: ['distance', 'dist', 'lap_distance', 'lap_dist', 'distance_lap', 's'],
  speed: ['speed', 'velocity', 'v', 'ground_speed', 'gps_speed', 'vehicle_speed', 'car_speed'],
  throttle: [
    'throttle',
    'throttle_pos',
    'throttle_position',
    'tps',
    'accelerator',
    'accel_pedal',
    'gas',
    'throttle_pedal',
  ],
  brake: ['brake', 'brake_pos', 'brake_position', 'brake_pedal', 'brakes'],
  // A brake column in pressure units is pressure (the units say so), as is a column named for it.
  brakePressure: [
    'brake',
    'brakes',
    'brake_pressure',
    'brake_press',
    'brake_pres',
    'brake_line_pressure',
    'brake_pressure_front',
    'brake_front_pressure',
    'brake_pressure_f',
    'brake_fluid_pressure',
  ],
  steering: ['steering', 'steering_angle', 'steer', 'steer_angle', 'steering_wheel_angle', 'swa'],
  gear: ['gear', 'gear_num', 'gear_number'],
  rpm: ['rpm', 'engine_rpm', 'engine_speed', 'revs'],
  x: ['x', 'pos_x', 'position_x', 'x_pos', 'east', 'easting'],
  y: ['y', 'pos_y', 'position_y', 'y_pos', 'north', 'northing'],
  lat: ['lat', 'latitude', 'gps_lat', 'gps_latitude'],
  lon: ['lon', 'lng', 'long', 'longitude', 'gps_lon', 'gps_long', 'gps_longitude'],
  ax: [
    'ax',
    'a_x',
    'accel_x',
    'acc_x',
    'long_accel',
    'accel_long',
    'longitudinal_acceleration',
    'longitudinal_accel',
    'g_long',
    'long_g',
    'gx',
    'long_acc',
    'acc_long',
    'longitudinal_acc',
    'longitudinal_g',
    'g_longitudinal',
    'accel_longitudinal',
    'inline_acc',
  ],
  ay: [
    'ay',
    'a_y',
    'accel_y',
    'acc_y',
    'lat_accel',
    'accel_lat',
    'lateral_acceleration',
    'lateral_accel',
    'g_lat',
    'lat_g',
    'gy',
    'lat_acc',
    'acc_lat',
    'lateral_acc',
    'lateral_g',
    'g_lateral',
    'accel_lateral',
  ],
};

const G = STANDARD_GRAVITY_MPS2;
/** Unit spellings (after squashing to letters, digits and "pct") -> factor to SI; null = decide from the data. */
const UNITS: Record<Quantity, Record<string, number | null>> = {
  time: { '': 1, s: 1, sec: 1, secs: 1, seconds: 1, ms: 0.001, msec: 0.001 },
  // Feet and miles: NIST SP 811 appendix B, 1 ft = 0.3048 m and 1 mi = 1609.344 m exactly.
  distance: { '': 1, m: 1, meters: 1, metres: 1, km: 1000, ft: 0.3048, feet: 0.3048, mi: 1609.344 },
  speed: {
    '': null,
    kmh: 1 / 3.6,
    kph: 1 / 3.6,
    ms: 1,
    mps: 1,
    mph: 0.44704,
    kn: 1852 / 3600,
    kt: 1852 / 3600,
    kts: 1852 / 3600,
    knots: 1852 / 3600,
  },
  throttle: { '': null, pct: 0.01, percent: 0.01, '01': 1, frac: 1, ratio: 1 },
  brake: { '': null, pct: 0.01, percent: 0.01, '01': 1, frac: 1, ratio: 1 },
  // To pascals (NIST SP 811 appendix B: 1 bar = 1e5 Pa, 1 psi = 6894.757 Pa).
  brakePressure: { bar: 1e5, mbar: 100, psi: 6894.757293168, kpa: 1000, mpa: 1e6, pa: 1 },
  steering: { '': 1, deg: 1, degrees: 1, rad: 180 / Math.PI },
  gear: { '': 1 },
  rpm: { '': 1, rpm: 1 },
  x: { '': 1, m: 1, ft: 0.3048, feet: 0.3048 },
  y: { '': 1, m: 1, ft: 0.3048, feet: 0.3048 },
  lat: { '': 1, deg: 1 },
  lon: { '': 1, deg: 1 },
  ax: { '': null, g: G, ms2: 1, mps2: 1 },
  ay: { '': null, g: G, ms2: 1, mps2: 1 },
};

const QUANTITY_ORDER: Quantity[] = [
  'time',
  'distance',
  'speed',
  'throttle',
  'brake',
  'brakePressure',
  'steering',
  'gear',
  'rpm',
  'x',
  'y',
  'lat',
  'lon',
  'ax',
  'ay',
];

function tokens(text: string): string[] {
  return text
    .toLowerCase()
    .replace(/%/g, ' pct ')
    .replace(/²/g, '2')
    .split(/[^a-z0-9]+/)
    .filter((token) => token.length > 0);
}

/** Reads one header as (quantity, factor), or null when it is none of ours. */
export function recogniseHeader(header: string): { quantity: Quantity; scale: number | null } | null {
  const bracket = /[[(]([^\])]*)[\])]/.exec(header);
  const baseTokens = tokens(bracket ? header.replace(bracket[0], ' ') : header);
  const bracketUnit = bracket ? tokens(bracket[1]!).join('') : null;
  if (baseTokens.length === 0) return null;
  for (const quantity of QUANTITY_ORDER) {
    const aliases = ALIASES[quantity];
    const units = UNITS[quantity];
    // Try the whole name as the base, then the last one to three tokens as a unit suffix.
    for (let suffix = 0; suffix <= Math.min(3, baseTokens.length - 1); suffix++) {
      const base = baseTokens.slice(0, baseTokens.length - suffix).join('_');
      if (!aliases.includes(base)) continue;
      const suffixUnit = baseTokens.slice(baseTokens.length - suffix).join('');
      const unit = suffix > 0 ? suffixUnit : (bracketUnit ?? '');
      if (suffix > 0 && bracketUnit !== null && bracketUnit !== '') continue;
      if (unit in units) return { quantity, scale: units[unit]! };
    }
  }
  return null;
}

/**
 * Binds the file's headers to channels: the user's mapping first (its names must exist), then recognised names
 * for the rest. The first column found for a quantity wins (speed in m/s is preferred over km/h when both exist).
 */
export function bindColumns(
  headers: string[],
  mapping: Record<string, string>,
  source: string,
): { bindings: ColumnBinding[]; ignored: string[] } {
  const trimmed = headers.map((header) => header.trim());
  const bindings = new Map<Quantity, ColumnBinding>();
  const used = new Set<number>();
  for (const [canonical, theirs] of Object.entries(mapping)) {
    const spec = CANONICAL_COLUMNS[canonical];
    if (!spec) {
      throw new InputError(
        `${source}: --telemetry-columns: unknown channel name '${canonical}' (known: ${Object.keys(CANONICAL_COLUMNS).join(', ')})`,
      );
    }
    let index = trimmed.indexOf(theirs.trim());
    if (index < 0) index = trimmed.findIndex((header) => header.toLowerCase() === theirs.trim().toLowerCase());
    if (index < 0) {
      throw new InputError(
        `${source}: --telemetry-columns ${canonical}=${theirs}: no column '${theirs}' in the header (found: ${trimmed.join(', ')})`,
      );
    }
    // A mapped throttle or brake keeps the unit its header states, else the data decide.
    const stated = spec.scale === null ? recogniseHeaderUnit(trimmed[index]!, spec.quantity) : spec.scale;
    bindings.set(spec.quantity, { quantity: spec.quantity, index, header: trimmed[index]!, scale: stated });
    used.add(index);
  }
  trimmed.forEach((header, index) => {
    if (used.has(index)) return;
    const recognised = recogniseHeader(header);
    if (!recognised) return;
    const held = bindings.get(recognised.quantity);
    // A later m/s speed column replaces an earlier one in other units (the simulate trace has both).
    const better =
      held && !used.has(held.index) && recognised.quantity === 'speed' && recognised.scale === 1 && held.scale !== 1;
    if (held && !better) return;
    bindings.set(recognised.quantity, { ...recognised, index, header });
  });
  const ignored = trimmed.filter((_, index) => ![...bindings.values()].some((binding) => binding.index === index));
  return { bindings: [...bindings.values()], ignored };
}

function recogniseHeaderUnit(header: string, quantity: Quantity): number | null {
  const recognised = recogniseHeader(header);
  return recognised && recognised.quantity === quantity ? recognised.scale : null;
}

/** The file's headers for a message, cut short past 200 characters. */
export function listedHeaders(headers: string[]): string {
  const text = headers.join(', ');
  return text.length > 200 ? `${text.slice(0, 200)}... (${headers.length} columns)` : text;
}
