// The friction-circle arithmetic against the friction ellipse's own algebra (Milliken and Milliken, Race Car
// Vehicle Dynamics, 1995, the friction circle / g-g diagram).

import { describe, expect, it } from 'vitest';
import { gripBudget } from '../../src/car/budget.js';
import { pointMassEnvelope } from '../../src/car/point-mass.js';
import { ambientFrom } from '../../src/car/ambient.js';
import { STANDARD_GRAVITY_MPS2 as g } from '../../src/units.js';
import { testCar } from '../helpers/cars.js';

describe('grip budget', () => {
  it('leaves sqrt(1 - s^2) of the braking on a friction circle when the lateral share is s', () => {
    const envelope = pointMassEnvelope(testCar({ mu: 1.0 }), ambientFrom());
    const budget = gripBudget(envelope, 30, 0.6 * g);
    expect(budget.lateralLimitG).toBeCloseTo(1.0, 6);
    expect(budget.lateralShare).toBeCloseTo(0.6, 6);
    expect(budget.brakingAvailableG).toBeCloseTo(0.8, 6);
    expect(budget.linearBrakingAvailableG).toBeCloseTo(0.4, 6);
    expect(budget.accelAvailableG).toBeCloseTo(0.8, 6);
  });

  it('has nothing left beyond the lateral limit', () => {
    const envelope = pointMassEnvelope(testCar({ mu: 1.0 }), ambientFrom());
    const budget = gripBudget(envelope, 30, 1.2 * g);
    expect(budget.lateralShare).toBeGreaterThan(1);
    expect(budget.brakingAvailableG).toBe(0);
  });
});
