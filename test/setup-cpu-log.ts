// With REFLAP_TEST_CPU_LOG set to a file, appends one JSON line per test file: the CPU time its worker spent from
// before the file was imported to after its last test (user and system, worker threads included) and the CPU of the
// child processes it waited for (Linux: /proc/self/stat), so the suite's cost can be read per file on a shared
// machine, where wall time says little. Off by default: it costs nothing when the variable is unset.

import { appendFileSync, readFileSync } from 'node:fs';
import { afterAll, beforeAll, expect } from 'vitest';

const logFile = process.env.REFLAP_TEST_CPU_LOG;

/** CPU seconds of the child processes this process has waited for (fields 16 and 17 of /proc/self/stat). */
function childCpuS(): number {
  try {
    const stat = readFileSync('/proc/self/stat', 'utf8');
    const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
    // Fields counted from 3 (state) after the command name: cutime is field 16, cstime 17; clock ticks of 1/100 s.
    return (Number(fields[13]) + Number(fields[14])) / 100;
  } catch {
    return 0;
  }
}

if (logFile !== undefined && logFile !== '') {
  const startCpu = process.cpuUsage();
  const startChildS = childCpuS();
  const startWall = performance.now();
  let testPath = '';
  beforeAll(() => {
    testPath = expect.getState().testPath ?? '';
  });
  afterAll(() => {
    const cpu = process.cpuUsage(startCpu);
    const line = {
      file: testPath,
      cpuS: (cpu.user + cpu.system) / 1e6,
      childCpuS: childCpuS() - startChildS,
      wallS: (performance.now() - startWall) / 1000,
    };
    appendFileSync(logFile, JSON.stringify(line) + '\n');
  });
}
