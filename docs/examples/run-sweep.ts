import { readTrackFile, readCarFile, ambientFrom, setupBaseFrom, parseVariation, runSweep } from 'reflap';

const track = readTrackFile('tracks/velmora-downs.json', { stepM: 2 });
const car = readCarFile('cars/tarnfell-gt.json');
const base = setupBaseFrom(car, ambientFrom(), []);
const variations = [parseVariation('massKg=1300:1400:50')];
const { table } = await runSweep({ track, base, variations }, { workers: 2 });
// The table starts with the baseline and the runs either side of it (for the sensitivities), then the grid.
const grid = table.records.filter((record) => record.kind === 'grid');
for (const record of grid) console.log(`${record.values.join(', ')} kg: ${record.lapTimeS.toFixed(3)} s`);
if (!grid.every((record, k) => k === 0 || record.lapTimeS > grid[k - 1]!.lapTimeS))
  throw new Error('heavier is slower');
