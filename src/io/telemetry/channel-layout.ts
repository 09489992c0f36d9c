// Which channels a telemetry read delivers, decided once from the bound columns (less those left out as empty):
// time always, positions from x/y or from latitude/longitude, and which channels still wait for their units.

import { listedHeaders, type ColumnBinding, type Quantity } from './columns.js';
import { FIELD_OF, type TelemetryChannel } from './chunk.js';
import { localPlane, type LocalPlane } from '../../track/geodesy.js';
import type { ChannelLayout, DecidedUnits } from './units-from-data.js';

/** The layout, the column of each channel, the plane for GPS positions once its origin is known, and the first problem. */
export interface ResolvedLayout {
  layout: ChannelLayout;
  columnOfField: Map<TelemetryChannel, number>;
  plane: LocalPlane | null;
  error: string | null;
}

export function resolveLayout(
  bindings: ColumnBinding[],
  headers: string[],
  timeIndex: number,
  dropped: readonly boolean[],
  decided: DecidedUnits | null,
  source: string,
): ResolvedLayout {
  let error: string | null = null;
  let plane: LocalPlane | null = null;
  const columnOfField = new Map<TelemetryChannel, number>();
  const present = (quantity: Quantity): number => {
    const b = bindings.findIndex((binding) => binding.quantity === quantity);
    // Before the end of the file nothing goes out while a column has had no value, unless a scan knows it has one.
    return b >= 0 && !dropped[b] ? b : -1;
  };
  const [x, y, lat, lon] = [present('x'), present('y'), present('lat'), present('lon')];
  if (x < 0 !== y < 0)
    error ??= `${source}: column ${bindings[Math.max(x, y)]!.header} has no partner; positions need both x_m and y_m`;
  if (lat < 0 !== lon < 0)
    error ??= `${source}: column ${bindings[Math.max(lat, lon)]!.header} has no partner; GPS positions need both latitude and longitude`;
  const positions = x >= 0 && y >= 0 ? 'xy' : lat >= 0 && lon >= 0 ? 'latlon' : null;
  if (present('speed') < 0 && present('distance') < 0 && positions === null) {
    error ??= `${source}: no position, distance or speed column (found: ${listedHeaders(headers)}); map one with --telemetry-columns`;
  }
  const layout: ChannelLayout = {
    channels: ['timeS'],
    positions,
    pending: [],
    headers: { timeS: bindings[timeIndex]!.header },
  };
  columnOfField.set('timeS', timeIndex);
  for (const quantity of [
    'distance',
    'speed',
    'throttle',
    'brake',
    'brakePressure',
    'ax',
    'ay',
    'steering',
    'gear',
    'rpm',
    ...(positions === 'xy' ? ['x', 'y'] : positions === 'latlon' ? ['lat', 'lon'] : []),
  ] as Quantity[]) {
    const b = present(quantity);
    if (b < 0) continue;
    const field = FIELD_OF[quantity];
    layout.channels.push(field);
    layout.headers[field] = bindings[b]!.header;
    columnOfField.set(field, b);
    const open = bindings[b]!.scale === null && ['speed', 'throttle', 'brake', 'ax', 'ay'].includes(quantity);
    if (open && decided?.factors[field] === undefined) layout.pending.push(field);
  }
  if (positions === 'latlon') {
    if (decided?.geoOrigin) plane = localPlane(decided.geoOrigin);
    else layout.pending.push('xM', 'yM');
  }
  return { layout, columnOfField, plane, error };
}
