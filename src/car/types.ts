// The car and the air it drives through, as validated typed records in SI units.

export type DrivenAxle = 'rear' | 'front' | 'all';
export type CarModelKind = 'point-mass' | 'bicycle';

export interface TorqueCurve {
  rpm: number[];
  torqueNm: number[];
}

export interface Gearing {
  torqueCurve: TorqueCurve;
  gearRatios: number[];
  finalDrive: number;
  wheelRadiusM: number;
  shiftTimeS: number;
  maxRpm: number;
}

export interface Car {
  name: string;
  model: CarModelKind;
  massKg: number;
  /** Static share of weight on the front axle, 0-1. */
  frontWeightFraction: number;
  cgHeightM: number | null;
  wheelbaseM: number | null;
  /** Overall width of the car, m (used for the racing-line margin). */
  widthM: number | null;
  trackFrontM: number | null;
  trackRearM: number | null;
  rollStiffnessFrontFraction: number | null;
  rollingResistanceCoeff: number;
  tyre: {
    muLong: number;
    muLat: number;
    /** Exponent of the friction ellipse: 2 = ellipse, larger = squarer. */
    ggExponent: number;
    /** Fall of mu per unit of normal load over the static load (0 = no load sensitivity). */
    loadSensitivity: number;
    corneringStiffnessFrontNPerRad: number | null;
    corneringStiffnessRearNPerRad: number | null;
  };
  aero: {
    /** Drag coefficient times frontal area, m^2. */
    dragAreaM2: number;
    /** Downforce coefficient times area, m^2, positive = downforce. */
    liftAreaM2: number;
    frontDownforceFraction: number | null;
  };
  powertrain: {
    maxPowerW: number;
    /** Share of the engine's power that reaches the driven wheels, with or without a gearbox model. */
    drivetrainEfficiency: number;
    drive: DrivenAxle;
    gearing: Gearing | null;
  };
  brakes: {
    maxDecelG: number | null;
    frontBias: number | null;
  };
  fuel: {
    massKg: number;
    burnKgPerLap: number;
  };
  /** How sure the file is of its numbers (src/uncertainty); absent = every value taken as exact. */
  uncertainty?: CarUncertainty;
  /** Where each value came from (a fitted car notes its fit), by the field's dotted name. */
  origin?: Readonly<Record<string, string>>;
}

/** Standard deviations of uncertain fields, by the dotted names sweeps use (e.g. 'tyre.muLat'), and their correlations. */
export interface CarUncertainty {
  sd: Readonly<Record<string, number>>;
  correlation: readonly { fields: readonly [string, string]; r: number }[];
}

export interface Ambient {
  airTempC: number;
  pressureHpa: number;
  airDensityKgPerM3: number;
  /** Multiplier on the engine's rated power for these air conditions (1 at the rating's reference conditions). */
  powerFactor: number;
}
