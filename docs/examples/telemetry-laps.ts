import { readTrackFile, readTelemetryFile, selectLap, cutLaps, alignLap } from 'reflap';

const track = readTrackFile('tracks/velmora-downs.json');
const session = await readTelemetryFile('session.csv', { columns: {} });
const { lap, laps, notes } = selectLap(session, track); // the fastest complete lap
console.log(`fastest of ${laps.length} laps: ${lap.lapTimeS.toFixed(3)} s`, notes);
const { laps: all } = cutLaps(session, track, { startFinish: { xM: 120, yM: -40 } });
const third = alignLap(
  session,
  all.find((cut) => cut.lapNumber === 3)!,
  track,
);
console.log(`lap 3: ${third.lapTimeS.toFixed(3)} s`);
