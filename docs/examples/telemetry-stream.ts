import { streamTelemetryCsv } from 'reflap';

let maxSpeedMps = 0;
const summary = await streamTelemetryCsv('day.csv', { columns: {} }, (chunk) => {
  for (let i = 0; i < chunk.rows; i++) maxSpeedMps = Math.max(maxSpeedMps, chunk.speedMps![i]!);
});
// summary: { rows, channels, startTimeS, endTimeS, geoOrigin, notes }
console.log(`${summary.rows} rows, top speed ${(maxSpeedMps * 3.6).toFixed(1)} km/h`);
