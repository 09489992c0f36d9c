import {
  readTrackFile,
  readCarFile,
  ambientFrom,
  buildEnvelope,
  simulate,
  checkTransient,
  demoDriverLap,
  demoLogCsv,
  parseTelemetryText,
  cutLaps,
  checkText,
  noteText,
  displayUnits,
} from 'reflap';

const track = readTrackFile('tracks/velmora-downs.json', { stepM: 2 });
const car = { ...readCarFile('cars/tarnfell-gt.json'), model: 'bicycle' as const };
const ambient = ambientFrom();
const lap = simulate(track, car, { ambient });
const imperial = displayUnits('imperial');
// The transient check's verdict is a Note: its distances and speeds are SI quantities until noteText writes them.
const check = checkTransient(lap, car, { ambient });
console.log(`transient check: ${noteText(check.verdict)}`);
console.log(`the same in mph and feet: ${noteText(check.verdict, imperial)}`);

// A log's lap-cutting notes are Notes too: the demo log's partial laps before and after its flying lap.
const csv = demoLogCsv(track, demoDriverLap(track, lap, buildEnvelope(car, ambient)));
const { laps, notes } = cutLaps(parseTelemetryText(csv, 'demo-lap.csv', { columns: {} }), track);
for (const cut of notes) console.log(`- ${noteText(cut, imperial)}`);
if (!laps.some((cut) => cut.complete)) throw new Error('no complete lap');
if (!notes.some((cut) => / ft /.test(noteText(cut, imperial)))) throw new Error('no distance in feet');

// checkText is async: it loads the reader a file needs on first use. Its notes are plain text, in the file's units.
const fileCheck = await checkText(csv, 'demo-lap.csv');
console.log(`${fileCheck.file}: ${fileCheck.summary ?? 'unreadable'}, ${fileCheck.problems.length} problems`);
if (fileCheck.problems.length > 0) throw new Error(fileCheck.problems.join('; '));
