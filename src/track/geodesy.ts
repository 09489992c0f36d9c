// Latitude/longitude to a local east/north plane in metres: the local tangent plane (ENU) on the WGS 84
// ellipsoid, through geodetic -> ECEF -> ENU (e.g. Hofmann-Wellenhof, Lichtenegger & Wasle, "GNSS", 2008,
// sec. 10.2; WGS 84 constants from NIMA TR8350.2). Points are taken on the ellipsoid (height 0).

/** WGS 84 semi-major axis, m, and flattening (NIMA TR8350.2, table 3.1). */
const WGS84_A_M = 6378137;
const WGS84_F = 1 / 298.257223563;
const WGS84_E2 = WGS84_F * (2 - WGS84_F);

export interface GeoOrigin {
  latDeg: number;
  lonDeg: number;
}

/** A projector bound to one origin; reuses the origin's trigonometry for every point. */
export interface LocalPlane {
  origin: GeoOrigin;
  /** Writes east and north, m, of (latDeg, lonDeg) into out[0], out[1]. */
  toLocal(latDeg: number, lonDeg: number, out: Float64Array): void;
  /** Inverse of toLocal (Newton iteration on the forward map), degrees into out[0] = lat, out[1] = lon. */
  toGeodetic(eastM: number, northM: number, out: Float64Array): void;
}

const RAD = Math.PI / 180;

export function localPlane(origin: GeoOrigin): LocalPlane {
  const lat0 = origin.latDeg * RAD;
  const lon0 = origin.lonDeg * RAD;
  const sinLat0 = Math.sin(lat0);
  const cosLat0 = Math.cos(lat0);
  const sinLon0 = Math.sin(lon0);
  const cosLon0 = Math.cos(lon0);
  const n0 = WGS84_A_M / Math.sqrt(1 - WGS84_E2 * sinLat0 * sinLat0);
  const x0 = n0 * cosLat0 * cosLon0;
  const y0 = n0 * cosLat0 * sinLon0;
  const z0 = n0 * (1 - WGS84_E2) * sinLat0;
  // Radii of curvature at the origin: meridian (M) and prime vertical (N), for the inverse's first guess.
  const meridianM = (WGS84_A_M * (1 - WGS84_E2)) / Math.pow(1 - WGS84_E2 * sinLat0 * sinLat0, 1.5);
  const primeM = n0;

  const toLocal = (latDeg: number, lonDeg: number, out: Float64Array): void => {
    const lat = latDeg * RAD;
    const lon = lonDeg * RAD;
    const sinLat = Math.sin(lat);
    const cosLat = Math.cos(lat);
    const n = WGS84_A_M / Math.sqrt(1 - WGS84_E2 * sinLat * sinLat);
    const dx = n * cosLat * Math.cos(lon) - x0;
    const dy = n * cosLat * Math.sin(lon) - y0;
    const dz = n * (1 - WGS84_E2) * sinLat - z0;
    out[0] = -sinLon0 * dx + cosLon0 * dy;
    out[1] = -sinLat0 * cosLon0 * dx - sinLat0 * sinLon0 * dy + cosLat0 * dz;
  };

  const scratch = new Float64Array(2);
  const toGeodetic = (eastM: number, northM: number, out: Float64Array): void => {
    let lat = origin.latDeg + northM / meridianM / RAD;
    let lon = origin.lonDeg + eastM / (primeM * cosLat0) / RAD;
    for (let iteration = 0; iteration < 4; iteration++) {
      toLocal(lat, lon, scratch);
      lat += (northM - scratch[1]!) / meridianM / RAD;
      lon += (eastM - scratch[0]!) / (primeM * Math.cos(lat * RAD)) / RAD;
    }
    out[0] = lat;
    out[1] = lon;
  };

  return { origin, toLocal, toGeodetic };
}

/** Projects latitude/longitude arrays about their mean position; returns east/north and the origin used. */
export function projectLatLon(
  latDeg: Float64Array,
  lonDeg: Float64Array,
): { xM: Float64Array; yM: Float64Array; origin: GeoOrigin } {
  let latSum = 0;
  let lonSum = 0;
  for (let i = 0; i < latDeg.length; i++) {
    latSum += latDeg[i]!;
    lonSum += lonDeg[i]!;
  }
  const origin = { latDeg: latSum / latDeg.length, lonDeg: lonSum / lonDeg.length };
  const plane = localPlane(origin);
  const xM = new Float64Array(latDeg.length);
  const yM = new Float64Array(latDeg.length);
  const point = new Float64Array(2);
  for (let i = 0; i < latDeg.length; i++) {
    plane.toLocal(latDeg[i]!, lonDeg[i]!, point);
    xM[i] = point[0]!;
    yM[i] = point[1]!;
  }
  return { xM, yM, origin };
}

/** Moves local-plane positions from one origin's plane to another's (via latitude/longitude). */
export function reprojectPlane(
  xM: Float64Array,
  yM: Float64Array,
  from: GeoOrigin,
  to: GeoOrigin,
): { xM: Float64Array; yM: Float64Array } {
  const source = localPlane(from);
  const target = localPlane(to);
  const outX = new Float64Array(xM.length);
  const outY = new Float64Array(yM.length);
  const geodetic = new Float64Array(2);
  const local = new Float64Array(2);
  for (let i = 0; i < xM.length; i++) {
    source.toGeodetic(xM[i]!, yM[i]!, geodetic);
    target.toLocal(geodetic[0]!, geodetic[1]!, local);
    outX[i] = local[0]!;
    outY[i] = local[1]!;
  }
  return { xM: outX, yM: outY };
}
