#!/usr/bin/env node
// Entry point of `npx sealwork`: loads the TypeScript command line through tsx.
import { register } from 'tsx/esm/api';

// A reader that stops early (`sealwork demo | head`) closes the pipe: that is not an error.
process.stdout.on('error', (error) => {
  if (error.code === 'EPIPE') process.exit(process.exitCode ?? 0);
  throw error;
});

register();
const { main } = await import('./cli.ts');
process.exitCode = await main(process.argv.slice(2));
