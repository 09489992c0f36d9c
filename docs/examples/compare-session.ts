import {
  readTrackFile,
  readCarFile,
  ambientFrom,
  buildEnvelope,
  simulate,
  demoDriverLap,
  demoLogCsv,
  parseTelemetryText,
  compareSession,
  findingText,
} from 'reflap';

const track = readTrackFile('tracks/velmora-downs.json');
const car = readCarFile('cars/tarnfell-gt.json');
const ambient = ambientFrom();
const reference = simulate(track, car, { ambient, envelope: buildEnvelope(car, ambient) });
const csv = demoLogCsv(track, demoDriverLap(track, reference, buildEnvelope(car, ambient)));
const session = parseTelemetryText(csv, 'demo-lap.csv', { columns: {} });
const { result } = compareSession(track, car, session, { ambient });
console.log(`driver ${result.driverLapTimeS.toFixed(2)} s, reference ${result.referenceLapTimeS.toFixed(2)} s`);
for (const finding of result.findings.slice(0, 3)) console.log(`- ${findingText(finding)}`);
if (result.corners.length === 0) throw new Error('no corners compared');
