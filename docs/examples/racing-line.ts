import { readTrackFile, readCarFile, racingLine } from 'reflap';

const track = readTrackFile('tracks/velmora-downs.json', { stepM: 2 });
const car = readCarFile('cars/tarnfell-gt.json');
const line = racingLine(track, car, { objective: 'curvature' });
const gainS = line.centrelineLap.lapTimeS - line.lap.lapTimeS;
console.log(`the minimum-curvature line gains ${gainS.toFixed(2)} s on the centreline`);
console.log(`largest offset ${Math.max(...line.offsetM.map(Math.abs)).toFixed(1)} m from the centreline`);
if (!(gainS >= 0)) throw new Error('the line is slower than the centreline');
