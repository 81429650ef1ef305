/** The engine's version, recorded with every rating; it changes whenever a number could. */
export const ENGINE_VERSION = '0.2.0';
