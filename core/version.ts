/**
 * The engine's version, stored with every saved plan. Bump it whenever a change can alter
 * any figure of an evaluation, so an old plan that no longer reproduces says why.
 */
export const ENGINE_VERSION = '0.3.0';
