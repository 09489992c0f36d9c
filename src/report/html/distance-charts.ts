// The lap report's charts along the distance, one function per chart: speed (with the uncertainty band), the
// driver's time delta, the pedals and grip use, each drawn for the reference, the driver and the other lap.

import { stateSpans, type DistanceChartSpec, type DistanceSeries } from './distance-chart.js';
import type { ReportModel } from './model.js';
import { GRIP_NEAR_LIMIT, GRIP_OVER_LIMIT, PALETTE } from './palette.js';
import { paddedDomain, quantileOf } from './scale.js';

const REFERENCE_DASH = '6 3';

function range(values: (ArrayLike<number> | null | undefined)[]): [number, number] {
  let min = Infinity;
  let max = -Infinity;
  for (const series of values) {
    if (!series) continue;
    for (let i = 0; i < series.length; i++) {
      const v = series[i]!;
      if (!Number.isFinite(v)) continue;
      if (v < min) min = v;
      if (v > max) max = v;
    }
  }
  return [min, max];
}

function negated(values: ArrayLike<number>): Float64Array {
  const out = new Float64Array(values.length);
  for (let i = 0; i < values.length; i++) out[i] = -values[i]!;
  return out;
}

/** What every chart of one page shares: the distance axis and the three laps' series styles. */
interface ChartContext {
  model: ReportModel;
  base: Omit<DistanceChartSpec, 'name' | 'title' | 'yTitle' | 'yDomain' | 'height' | 'series'>;
  refSeries: (values: ArrayLike<number>, label?: string) => DistanceSeries;
  drvSeries: (values: ArrayLike<number>, label?: string) => DistanceSeries;
  othSeries: (values: ArrayLike<number>, label?: string) => DistanceSeries;
}

function chartContext(model: ReportModel): ChartContext {
  const track = model.input.reference.track;
  const units = model.units;
  const driver = model.driver;
  const other = model.other;
  return {
    model,
    base: {
      stationM: model.stationM,
      lengthM: model.lengthM,
      stepM: track.stepM,
      distanceLabel: units.distanceLabel,
      distancePerM: units.distance(1),
      corners: model.corners.map((corner) => ({ id: corner.id, name: corner.name, apexM: corner.apexM })),
    },
    refSeries: (values, label = 'reference') => ({
      label,
      colour: PALETTE.reference,
      values,
      ...(driver ? { dash: REFERENCE_DASH } : {}),
    }),
    drvSeries: (values, label = 'driver') => ({ label, colour: PALETTE.driver, values }),
    othSeries: (values, label = other?.label ?? '') => ({ label, colour: PALETTE.other, values, width: 1.3 }),
  };
}

/** Speed of every lap, with the reference's 90 % band where the car's uncertainty was drawn. */
function speedChart({ model, base, refSeries, drvSeries, othSeries }: ChartContext): DistanceChartSpec {
  const { reference, driver, other, units } = model;
  const uncertainty = model.input.uncertainty;
  const shown = (values: Float64Array) => values.map(units.speed);
  const speedRange = uncertainty
    ? [
        {
          low: shown(uncertainty.speedMps.low),
          high: shown(uncertainty.speedMps.high),
          colour: PALETTE.reference,
          label: `reference, 90 % band over ${uncertainty.draws} draws`,
        },
      ]
    : [];
  const [speedMin, speedMax] = range([
    reference.speedShown,
    driver?.speedShown,
    other?.speedShown,
    ...speedRange.flatMap((r) => [r.low, r.high]),
  ]);
  const speedSeries = [refSeries(reference.speedShown)];
  if (driver) speedSeries.push(drvSeries(driver.speedShown));
  if (other) speedSeries.push(othSeries(other.speedShown));
  return {
    ...base,
    name: 'speed',
    title: 'Speed',
    yTitle: `speed, ${units.speedLabel}`,
    yDomain: [Math.max(0, paddedDomain(speedMin, speedMax)[0]), paddedDomain(speedMin, speedMax)[1]],
    height: 210,
    series: speedSeries,
    ...(speedRange.length > 0 ? { ranges: speedRange } : {}),
    rescaleKeys: ['vR', 'vD', 'vO', 'vLo', 'vHi'],
  };
}

/** The driver's time delta against the reference (and against the other lap). */
function deltaChart({ model, base }: ChartContext, driver: NonNullable<ReportModel['driver']>): DistanceChartSpec {
  const other = model.other;
  const [deltaMin, deltaMax] = range([driver.deltaS, other?.driverDeltaS]);
  const deltaSeries: DistanceSeries[] = [
    {
      label: other ? 'driver − reference' : 'driver − reference (+ = slower)',
      colour: PALETTE.delta,
      values: driver.deltaS,
      // With two deltas the lines alone read more clearly than two overlapping fills.
      fillToZero: !other,
      width: 1.8,
    },
  ];
  if (other)
    deltaSeries.push({
      label: `driver − ${other.label}`,
      colour: PALETTE.other,
      values: other.driverDeltaS,
      width: 1.5,
    });
  return {
    ...base,
    name: 'delta',
    title: other ? 'Time delta of the driver (+ = slower)' : 'Time delta (driver − reference)',
    yTitle: 'delta, s',
    yDomain: paddedDomain(Math.min(0, deltaMin), Math.max(0, deltaMax), 0.08),
    height: 150,
    series: deltaSeries,
    guides: [0],
    rescaleKeys: ['dt', 'dtO'],
    rescaleWithZero: true,
  };
}

/** Throttle upward, brake downward, so the two never hide each other; the reference's gear shifts shaded. */
function pedalsChart({ model, base, refSeries, drvSeries, othSeries }: ChartContext): DistanceChartSpec {
  const { reference, driver, other } = model;
  const pedalSeries: DistanceSeries[] = [
    refSeries(reference.throttlePct!, 'reference'),
    // An empty label shares the legend entry of the series before it.
    { ...refSeries(negated(reference.brakePct!)), label: '' },
  ];
  let note: string | undefined;
  if (driver) {
    if (driver.throttlePct) pedalSeries.push(drvSeries(driver.throttlePct, 'driver'));
    if (driver.brakePct) pedalSeries.push({ ...drvSeries(negated(driver.brakePct)), label: '' });
    if (other?.throttlePct) pedalSeries.push(othSeries(other.throttlePct));
    if (other?.brakePct) pedalSeries.push({ ...othSeries(negated(other.brakePct)), label: '' });
    if (!driver.throttlePct && !driver.brakePct) note = 'the driver’s log has no pedal channels';
    else if (!driver.throttlePct || !driver.brakePct)
      note = `the driver’s log has no ${driver.throttlePct ? 'brake' : 'throttle'} channel`;
    if (other && !other.throttlePct && !other.brakePct)
      note = [note, `${other.label} has no pedal channels`].filter(Boolean).join('; ');
  }
  // Throttle is the share of the engine's drive in use; an upshift's gap in drive is shaded, not drawn as a lift.
  const shiftSpans = reference.shift ? stateSpans(reference.shift, model.stationM, base.stepM, PALETTE.shiftShade) : [];
  return {
    ...base,
    name: 'pedals',
    title: 'Throttle (up) and brake (down)',
    ...(shiftSpans.length > 0
      ? {
          spans: shiftSpans,
          legendExtra: [{ label: 'gear shift (reference)', colour: PALETTE.shiftShade, mark: 'swatch' as const }],
        }
      : {}),
    yTitle: 'brake ↓ · throttle ↑, %',
    yDomain: [-108, 108],
    yFormat: (value) => String(Math.abs(value)),
    height: 190,
    series: pedalSeries,
    guides: [0],
    ...(note ? { note } : {}),
  };
}

/** Grip use, with the reference's power-limited stretches shaded. */
function gripChart({ model, base, refSeries, drvSeries }: ChartContext): DistanceChartSpec {
  const { reference, driver } = model;
  // A logged lap's grip use can spike where its accelerations are noisy: the axis follows its 99.5th percentile.
  const gripMax = Math.max(range([reference.gripUsePct])[1], driver ? quantileOf([driver.gripUsePct], 0.995) : 0);
  return {
    ...base,
    name: 'grip',
    title: 'Grip use (the tyres’ share of their limit)',
    spans: reference.powerLimited
      ? stateSpans(reference.powerLimited, model.stationM, base.stepM, PALETTE.powerLimitedShade)
      : [],
    yTitle: 'grip use, %',
    yDomain: [0, Math.min(200, Math.max(115, Math.ceil((gripMax + 5) / 10) * 10))],
    height: 170,
    series: driver
      ? [refSeries(reference.gripUsePct), drvSeries(driver.gripUsePct)]
      : [refSeries(reference.gripUsePct)],
    bands: [
      { from: GRIP_NEAR_LIMIT * 100, to: GRIP_OVER_LIMIT * 100, colour: '#fbe7bd' },
      { from: GRIP_OVER_LIMIT * 100, to: 1000, colour: '#f5e1ec' },
    ],
    guides: [100],
    legendExtra: [
      { label: 'near the limit', colour: '#fbe7bd', mark: 'swatch' },
      { label: 'over', colour: '#f5e1ec', mark: 'swatch' },
      { label: 'power-limited (reference)', colour: PALETTE.powerLimitedShade, mark: 'swatch' },
    ],
    rescaleKeys: ['gR', 'gD'],
  };
}

/** The centreline's height along the lap, under the speed it shapes (tracks with heights only). */
function heightChart({ model, base }: ChartContext, zM: Float64Array): DistanceChartSpec {
  const units = model.units;
  const shown = zM.map(units.distance);
  const [low, high] = range([shown]);
  return {
    ...base,
    name: 'height',
    title: 'Height of the track',
    yTitle: `height, ${units.distanceLabel}`,
    yDomain: paddedDomain(low, high),
    height: 120,
    series: [{ label: 'centreline height', colour: PALETTE.axis, values: shown, width: 1.5 }],
  };
}

/** The lap report's charts along the distance: speed, the track's height (where it has heights), the driver's
 * delta (with a driver), pedals, grip use. */
export function distanceCharts(model: ReportModel): DistanceChartSpec[] {
  const context = chartContext(model);
  const zM = model.input.reference.track.zM;
  return [
    speedChart(context),
    ...(zM ? [heightChart(context, zM)] : []),
    ...(model.driver ? [deltaChart(context, model.driver)] : []),
    pedalsChart(context),
    gripChart(context),
  ];
}
