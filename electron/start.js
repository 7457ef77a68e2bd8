#!/usr/bin/env node
// Entry point of `npm start`: the desktop window, or the browser host where Electron is absent.
import { register } from 'tsx/esm/api';

register();
const { launch } = await import('./launch.ts');
await launch(process.argv.slice(2));
