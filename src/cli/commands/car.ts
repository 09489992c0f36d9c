// `reflap car`: describes a car file (axle loads, understeer gradient, characteristic or critical speed, the
// envelope at a few speeds), as text, JSON, or a g-g-v picture.

import type { Command } from 'commander';
import { addCarOptions, inputFilesOf, loadCar, type CarOptionValues } from '../options.js';
import { outputBatch } from '../output.js';
import { buildEnvelope } from '../../car/build-envelope.js';
import { describeCar } from '../../car/describe.js';
import { carDescriptionText } from '../../report/car-description.js';
import { carPageHtml } from '../../report/html/car-page.js';
import { addUnitsOption, unitsOf, type UnitsOptionValues } from '../units-option.js';
import { roundedJson } from '../../report/json-numbers.js';

interface CarValues extends CarOptionValues, UnitsOptionValues {
  json?: boolean;
  html?: string;
}

export function register(program: Command): void {
  const command = program
    .command('car')
    .description('describe a car: axle loads, understeer gradient, envelope at a few speeds');
  addCarOptions(command);
  command
    .option('--json', 'print one JSON object instead of the text')
    .option(
      '--html <file>',
      'also write the car page: the g-g-v envelope and its figures (one self-contained HTML page)',
    );
  addUnitsOption(command).action((values: CarValues) => runCar(values));
}

export function runCar(values: CarValues): void {
  const units = unitsOf(values);
  const { car, ambient } = loadCar(values);
  const envelope = buildEnvelope(car, ambient);
  const description = describeCar(car, ambient, envelope);
  const outputs = outputBatch(inputFilesOf(values));
  if (values.html) outputs.add(values.html, carPageHtml(description, envelope, units));
  outputs.commit();
  if (values.json) {
    process.stdout.write(roundedJson(description));
  } else {
    process.stdout.write(carDescriptionText(description, units));
    if (values.html) process.stdout.write(`g-g-v picture written to ${values.html}\n`);
  }
}
