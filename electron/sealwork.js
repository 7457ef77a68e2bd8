#!/usr/bin/env node
// Entry point of `npx sealwork`: loads the TypeScript command line through tsx.
import { register } from 'tsx/esm/api';

register();
const { main } = await import('./cli.ts');
process.exitCode = await main(process.argv.slice(2));
