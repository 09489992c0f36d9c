// `npm run demo`: builds dist/ only when its sources changed since the last build (as `build.js --if-stale`), then
// runs the demo command in this same process, so the command pays one start of Node rather than two (npm's own
// start is the rest of what comes before the demo).

import { spawnSync } from 'node:child_process';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { builtFrom, currentSources } from './build-freshness.js';
import { root } from './source-fingerprint.js';

if (!builtFrom(currentSources())) {
  const build = spawnSync(process.execPath, [path.join(root, 'scripts', 'build.js')], { cwd: root, stdio: 'inherit' });
  if (build.status !== 0) process.exit(build.status ?? 1);
}
const { main } = await import(pathToFileURL(path.join(root, 'dist', 'src', 'cli', 'main.js')).href);
process.exitCode = await main([process.argv[0], path.join(root, 'bin', 'reflap.js'), 'demo', ...process.argv.slice(2)]);
