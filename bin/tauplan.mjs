#!/usr/bin/env node
// Entry point: registers the TypeScript loader shipped as a dependency, then runs the CLI.
import { register } from 'tsx/esm/api';

register();
const { main } = await import('../src/cli/main.ts');
process.exitCode = await main(process.argv.slice(2));
