#!/usr/bin/env node
// Entry point of the installed command: the compiled CLI lives in dist/ (built by `npm install` through the prepare script).
import { main } from '../dist/src/cli/main.js';

main(process.argv).then((code) => {
  process.exitCode = code;
});
