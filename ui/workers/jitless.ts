/**
 * Turns off zod's compiled parsers before any schema is built. Building one probes
 * `new Function`, which the pages' Content Security Policy (script-src 'self', no
 * 'unsafe-eval') refuses and reports; the worker imports this first so schemas built after
 * it parse the plain way.
 */
import { z } from 'zod';

z.config({ jitless: true });
