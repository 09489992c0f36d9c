// Special files as each file input of each command (issue 17): an empty file, a folder, a FIFO with no writer,
// /dev/zero, a file of NUL bytes and a single line of 17 MiB. The promise each time: exit 2 within seconds, one
// line on stderr naming the file, and nothing written where the command was told to write. The inputs are found
// from the commands' own declarations, so a new file option is attacked as soon as it exists.

import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildProgram } from '../../src/cli/main.js';
import { projectRoot, runCli } from '../helpers/cli.js';
import { writeTestOval } from '../helpers/tracks.js';

const work = mkdtempSync(path.join(tmpdir(), 'reflap-special-'));
const car = path.join(projectRoot, 'cars', 'brackle-club.json');
const oval = writeTestOval(work);
const valid = {
  lap: path.join(work, 'lap.csv'),
  corners: path.join(work, 'corners.json'),
  envelope: path.join(work, 'envelope.json'),
  line: path.join(work, 'line.csv'),
  part: path.join(work, 'part.csv'),
};

/** What each command needs besides the input under attack (the inputs' good values, then its other options). */
const baseArgs: Record<string, string[]> = {
  simulate: ['--track', oval, '--car', car],
  budget: ['--car', car, '--speed-kph', '120', '--radius-m', '90'],
  whatif: ['--track', oval, '--car', car, '--set', 'massKg=+20'],
  sweep: ['--track', oval, '--car', car, '--vary', 'massKg=600:620:20', '--workers', '0'],
  stint: ['--track', oval, '--car', car, '--laps', '2', '--workers', '0'],
  // compare reads --against and --envelope after it has built the reference: on the line written once in beforeAll,
  // not a racing line computed again for each of those attacks.
  compare: ['--track', oval, '--car', car, '--telemetry', valid.lap, '--line', valid.line],
  session: ['--track', oval, '--car', car, '--telemetry', valid.lap],
  envelope: ['--telemetry', valid.lap, '--car', car],
  calibrate: ['--telemetry', valid.lap, '--car', car],
  line: ['--track', oval, '--car', car],
  corners: ['--track', oval],
  car: ['--car', car],
  check: [car],
  heights: ['--track', oval, '--telemetry', path.join(projectRoot, 'test', 'fixtures', 'telemetry', 'circle.gpx')],
  demo: [],
};
/** Good values of the optional inputs, so each is also attacked where the others are good. */
const goodValue: Record<string, string> = {
  '--corners': valid.corners,
  '--envelope': valid.envelope,
  '--line': valid.line,
  '--against': valid.lap,
  '--merge': valid.part,
};

type Kind = 'empty' | 'folder' | 'fifo' | '/dev/zero' | 'NUL bytes' | 'one line of 2 MiB';
const kinds: Kind[] = ['empty', 'folder', 'fifo', '/dev/zero', 'NUL bytes', 'one line of 2 MiB'];
let hasFifo = true;

/** A special file of `kind`, named with `extension` (readers tell formats from the name). */
function specialFile(kind: Kind, extension: string): string {
  if (kind === '/dev/zero') return '/dev/zero';
  const file = path.join(work, 'special', `${kind.replace(/\W+/g, '-')}${extension}`);
  if (kind === 'empty') writeFileSync(file, '');
  else if (kind === 'folder') mkdirSync(file, { recursive: true });
  else if (kind === 'NUL bytes') writeFileSync(file, Buffer.alloc(256 * 1024));
  else if (kind === 'one line of 2 MiB') writeFileSync(file, '1,'.repeat(1024 * 1024));
  else if (kind === 'fifo') {
    rmSync(file, { force: true });
    execFileSync('mkfifo', [file]);
  }
  return file;
}

interface Attack {
  command: string;
  /** The option (or 'files' for check's arguments) given the special file. */
  input: string;
  /** The command line, with SLOT where the special file goes. */
  args: string[];
  /** Where the command was told to write, if it writes files. */
  outFolder: string | null;
}

const SLOT = '<special file>';
const attacks: Attack[] = [];

/** The command line of an attack on `input`: the base with the input's value replaced, or the input added. */
function commandLine(command: string, input: string): string[] {
  if (input === 'files') return [command, SLOT];
  if (input === '--merge') return [command, '--merge', goodValue['--merge']!, SLOT];
  const args = [command, ...baseArgs[command]!];
  const at = args.indexOf(input);
  if (at >= 0) args[at + 1] = SLOT;
  else args.push(input, SLOT);
  return args;
}

beforeAll(async () => {
  mkdirSync(path.join(work, 'special'));
  try {
    execFileSync('mkfifo', [path.join(work, 'special', 'probe')]);
  } catch {
    hasFifo = false;
  }
  const ok = (args: string[]) => expect(runCli(args).code).toBe(0);
  ok(['simulate', '--track', oval, '--car', car, '--out', valid.lap]);
  ok(['corners', '--track', oval, '--out', valid.corners]);
  ok(['envelope', '--telemetry', valid.lap, '--car', car, '--out', valid.envelope]);
  ok(['line', '--track', oval, '--car', car, '--out', valid.line]);
  ok(['sweep', '--track', oval, '--car', car, '--vary', 'massKg=600:620:20', '--workers', '0', '--out', valid.part]);

  const program = await buildProgram();
  for (const command of program.commands) {
    const name = command.name();
    const inputs = command.options
      .filter((option) => /<[^>]*file/.test(option.flags) && !['--out', '--html'].includes(option.long ?? ''))
      .map((option) => option.long!);
    if (command.registeredArguments.some((argument) => argument.name() === 'files')) inputs.push('files');
    const out = command.options.find((option) => option.long === '--out');
    for (const input of inputs) {
      const outFolder = out ? path.join(work, 'out', String(attacks.length)) : null;
      const args = commandLine(name, input);
      if (outFolder !== null) args.push('--out', path.join(outFolder, /<dir>/.test(out!.flags) ? 'report' : 'out.x'));
      attacks.push({ command: name, input, args, outFolder });
    }
  }
}, 120_000);

afterAll(() => rmSync(work, { recursive: true, force: true }));

describe('special files as every input of every command', () => {
  it('finds the inputs: every command but demo reads files, and each has a base', () => {
    expect(Object.keys(baseArgs).sort()).toEqual([...new Set(attacks.map((a) => a.command)), 'demo'].sort());
    // The inputs the commands declare today (a new one joins the attack by itself).
    expect(attacks.length).toBeGreaterThanOrEqual(30);
    for (const option of Object.keys(goodValue)) expect(attacks.some((a) => a.input === option)).toBe(true);
  });

  for (const kind of kinds)
    it(`${kind}: exit 2, one line naming the file, nothing written`, () => {
      if (kind === 'fifo' && !hasFifo) return;
      const problems: string[] = [];
      for (const attack of attacks) {
        const csv = ['--telemetry', '--against', '--line', '--merge'].includes(attack.input);
        const file = specialFile(kind, csv ? '.csv' : '.json');
        const started = performance.now();
        const run = runCli(attack.args.map((arg) => (arg === SLOT ? file : arg)));
        const seconds = (performance.now() - started) / 1000;
        const lines = run.stderr.trimEnd().split('\n');
        // check lists each file's problems on stdout and ends with one line of counts on stderr.
        const named = attack.input === 'files' ? run.stdout.includes(file) : lines[0]!.includes(file);
        const written = attack.outFolder !== null && existsSync(attack.outFolder) ? readdirSync(attack.outFolder) : [];
        const where = `${attack.command} ${attack.input}`;
        if (run.code !== 2) problems.push(`${where}: exit ${run.code}: ${run.stderr.slice(0, 300)}`);
        else if (lines.length !== 1 || !named) problems.push(`${where}: ${run.stderr.slice(0, 300)}`);
        if (written.length > 0) problems.push(`${where}: wrote ${written.join(', ')}`);
        // "Within seconds" (issue 17): a refusal reads nothing, so even a shared machine stays far below this.
        if (seconds > 10) problems.push(`${where}: took ${seconds.toFixed(1)} s`);
      }
      expect(problems).toEqual([]);
    });
});
