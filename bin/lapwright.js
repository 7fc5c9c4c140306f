#!/usr/bin/env node
// the lapwright command: runs the built CLI (npm run build) and exits with its code
import { runCli } from '../dist/src/cli/main.js';

process.exit(await runCli(process.argv.slice(2), { stdout: process.stdout, stderr: process.stderr, stdin: process.stdin, env: process.env }));
