#!/usr/bin/env node
// Entry of the `roundwise` batch CLI. The engine is TypeScript; tsx loads it without a build step.
import { register } from 'tsx/esm/api';

register();
const { main } = await import('./main.ts');
process.exitCode = await main(process.argv.slice(2));
