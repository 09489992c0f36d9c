import { readTrackFile, readCarFile, simulate, ambientFrom, formatLapTime } from 'reflap';

const track = readTrackFile('tracks/velmora-downs.json');
const car = readCarFile('cars/tarnfell-gt.json');
const lap = simulate(track, car, { ambient: ambientFrom({ airTempC: 25, pressureHpa: 1000 }) });
console.log(`${track.name}: ${formatLapTime(lap.lapTimeS)} over ${lap.track.lengthM.toFixed(0)} m`);
console.log(`top speed ${Math.max(...lap.trace.speedMps).toFixed(1)} m/s, ${lap.brakingZones.length} braking zones`);
if (!(lap.lapTimeS > 0)) throw new Error('no lap time');
