#!/usr/bin/env node
// Entry point of the `wrackline` command. It registers tsx so the TypeScript sources in
// generator/ run directly: no compile step to remember after `npm ci`.
import { register } from 'tsx/esm/api';

register();
const { main } = await import('../generator/cli/main.ts');
process.exitCode = await main(process.argv.slice(2));
