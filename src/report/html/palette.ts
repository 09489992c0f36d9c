// Colours of the lap report: the Okabe-Ito palette, chosen to stay distinguishable under the common forms
// of colour-vision deficiency (M. Okabe and K. Ito, "Color Universal Design (CUD): how to make figures and
// presentations that are friendly to colorblind people", J*FLY, 2008). Roles are assigned here only.

export const OKABE_ITO = {
  black: '#000000',
  orange: '#E69F00',
  skyBlue: '#56B4E9',
  bluishGreen: '#009E73',
  yellow: '#F0E442',
  blue: '#0072B2',
  vermillion: '#D55E00',
  reddishPurple: '#CC79A7',
} as const;

export const PALETTE = {
  reference: OKABE_ITO.blue,
  driver: OKABE_ITO.vermillion,
  /** The second lap of a lap-against-lap page. */
  other: OKABE_ITO.black,
  /** Where the driver gains or loses time against the chosen lap, and where the two are even. */
  gain: OKABE_ITO.bluishGreen,
  loss: OKABE_ITO.vermillion,
  even: '#c4c4c4',
  delta: OKABE_ITO.reddishPurple,
  carEnvelope: OKABE_ITO.black,
  demonstratedEnvelope: OKABE_ITO.bluishGreen,
  gripUnused: OKABE_ITO.skyBlue,
  gripNear: OKABE_ITO.orange,
  gripOver: OKABE_ITO.reddishPurple,
  powerLimited: OKABE_ITO.bluishGreen,
  /** Light shades of the states for chart backgrounds. */
  powerLimitedShade: '#d3ede4',
  shiftShade: '#c9c9c9',
  cursor: '#333333',
  grid: '#e3e3e3',
  axis: '#555555',
  trackSurface: '#dedede',
  gridPoint: '#8c8c8c',
} as const;

/** Grip-use classes on the track map: below NEAR is grip left unused, above OVER is beyond the envelope; 'power'
 * marks the reference where the engine's full drive holds it back with grip to spare (not near the limit). */
export const GRIP_NEAR_LIMIT = 0.9;
export const GRIP_OVER_LIMIT = 1.02;

export type GripClass = 'unused' | 'near' | 'over' | 'power';

export function gripClass(gripUse: number): GripClass {
  if (gripUse > GRIP_OVER_LIMIT) return 'over';
  if (gripUse >= GRIP_NEAR_LIMIT) return 'near';
  return 'unused';
}

export const GRIP_CLASS_COLOUR: Record<GripClass, string> = {
  unused: PALETTE.gripUnused,
  near: PALETTE.gripNear,
  over: PALETTE.gripOver,
  power: PALETTE.powerLimited,
};

export const GRIP_CLASS_LABEL: Record<GripClass, string> = {
  unused: `grip unused (< ${Math.round(GRIP_NEAR_LIMIT * 100)} %)`,
  near: 'near the limit',
  over: `over the limit (> ${Math.round(GRIP_OVER_LIMIT * 100)} %)`,
  power: 'power-limited (grip to spare)',
};

/** Colours for charts with many series of one kind (one per corner): the Okabe-Ito set without yellow, which is too faint on white. */
export const SERIES_COLOURS = [
  OKABE_ITO.blue,
  OKABE_ITO.vermillion,
  OKABE_ITO.bluishGreen,
  OKABE_ITO.reddishPurple,
  OKABE_ITO.orange,
  OKABE_ITO.skyBlue,
  OKABE_ITO.black,
] as const;
/** After every colour has been used once, the next round is dashed, then dotted, so no two series look alike. */
export const SERIES_DASHES = ['', '6 3', '2 2', '8 3 2 3'] as const;

export function seriesStyle(index: number): { colour: string; dash?: string } {
  const colour = SERIES_COLOURS[index % SERIES_COLOURS.length]!;
  const dash = SERIES_DASHES[Math.floor(index / SERIES_COLOURS.length) % SERIES_DASHES.length]!;
  return dash ? { colour, dash } : { colour };
}
