// The stretches of a followed lap where an axle of the single-track model uses its friction up to a threshold,
// each with the axle that saturates (front, rear or both) and its peak use.

export interface SaturationZone {
  fromM: number;
  toM: number;
  axle: 'front' | 'rear' | 'both';
  peakUse: number;
}

/** Runs of step records in which either axle's use reaches saturationUse, on the lap's stations. */
export function saturationZones(
  lapStationsM: Float64Array,
  frontUses: number[],
  rearUses: number[],
  saturationUse: number,
): SaturationZone[] {
  const saturation: SaturationZone[] = [];
  let open: SaturationZone | null = null;
  let frontPeak = 0;
  let rearPeak = 0;
  for (let k = 0; k < lapStationsM.length; k++) {
    const station = lapStationsM[k]!;
    const front = frontUses[k]!;
    const rear = rearUses[k]!;
    if (Math.max(front, rear) >= saturationUse) {
      if (!open) {
        open = { fromM: station, toM: station, axle: 'front', peakUse: 0 };
        frontPeak = rearPeak = 0;
      }
      open.toM = station;
      frontPeak = Math.max(frontPeak, front);
      rearPeak = Math.max(rearPeak, rear);
    } else if (open) {
      saturation.push(closeZone(open, frontPeak, rearPeak, saturationUse));
      open = null;
    }
  }
  if (open) saturation.push(closeZone(open, frontPeak, rearPeak, saturationUse));
  return saturation;
}

function closeZone(zone: SaturationZone, frontPeak: number, rearPeak: number, threshold: number): SaturationZone {
  const axle = frontPeak >= threshold && rearPeak >= threshold ? 'both' : frontPeak >= rearPeak ? 'front' : 'rear';
  return { ...zone, axle, peakUse: Math.max(frontPeak, rearPeak) };
}
