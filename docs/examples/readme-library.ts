import { readTrackFile, readCarFile, referenceLine, simulate } from 'reflap';

const track = readTrackFile('tracks/velmora-downs.json', { stepM: 1 });
const car = readCarFile('cars/tarnfell-gt.json');
const lap = simulate(track, car); // the centreline: simulate drives only the path it is given
const reference = referenceLine(track, car); // the minimum-time line, as the CLI drives it by default
const onLine = reference.lap ?? simulate(track, car, { path: reference.path });
console.log(lap.lapTimeS, onLine.lapTimeS, reference.kind, reference.note);
