// Chooses the envelope model a car asks for; the solver takes whatever this returns.

import type { Ambient, Car } from './types.js';
import type { Envelope } from './envelope.js';
import { pointMassEnvelope } from './point-mass.js';
import { bicycleEnvelope } from './bicycle-envelope.js';

export function buildEnvelope(car: Car, ambient: Ambient): Envelope {
  switch (car.model) {
    case 'point-mass':
      return pointMassEnvelope(car, ambient);
    case 'bicycle':
      return bicycleEnvelope(car, ambient);
  }
}
