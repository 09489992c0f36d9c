// A Car record written back as an ordinary car file (the format src/io/read-car.ts reads, docs/cars.md): every
// value explicit, optional records left out where the car has none, then the uncertainty block and the origin notes.

import type { Car } from '../car/types.js';

type Json = Record<string, unknown>;

/** Drops the keys whose value is null or undefined, so the file says nothing rather than something invalid. */
function present(record: Json): Json {
  return Object.fromEntries(Object.entries(record).filter(([, value]) => value !== null && value !== undefined));
}

export function carFileObject(car: Car): Json {
  const gearing = car.powertrain.gearing;
  return present({
    name: car.name,
    model: car.model,
    massKg: car.massKg,
    frontWeightFraction: car.frontWeightFraction,
    cgHeightM: car.cgHeightM,
    wheelbaseM: car.wheelbaseM,
    widthM: car.widthM,
    trackFrontM: car.trackFrontM,
    trackRearM: car.trackRearM,
    rollStiffnessFrontFraction: car.rollStiffnessFrontFraction,
    rollingResistanceCoeff: car.rollingResistanceCoeff,
    tyre: present({ ...car.tyre }),
    aero: present({ ...car.aero }),
    powertrain: present({
      maxPowerW: car.powertrain.maxPowerW,
      drivetrainEfficiency: car.powertrain.drivetrainEfficiency,
      drive: car.powertrain.drive,
      ...(gearing
        ? {
            torqueCurve: { rpm: [...gearing.torqueCurve.rpm], torqueNm: [...gearing.torqueCurve.torqueNm] },
            gearRatios: [...gearing.gearRatios],
            finalDrive: gearing.finalDrive,
            wheelRadiusM: gearing.wheelRadiusM,
            shiftTimeS: gearing.shiftTimeS,
            maxRpm: gearing.maxRpm,
          }
        : {}),
    }),
    brakes: present({ ...car.brakes }),
    fuel: { massKg: car.fuel.massKg, burnKgPerLap: car.fuel.burnKgPerLap },
    uncertainty: car.uncertainty
      ? {
          sd: { ...car.uncertainty.sd },
          ...(car.uncertainty.correlation.length > 0
            ? { correlation: car.uncertainty.correlation.map(({ fields, r }) => ({ fields: [...fields], r })) }
            : {}),
        }
      : null,
    origin: car.origin ? { ...car.origin } : null,
  });
}

export function carFileJson(car: Car): string {
  return JSON.stringify(carFileObject(car), null, 2) + '\n';
}
