import pkg from '../../package.json' with { type: 'json' }

/** Stored with every run so an old answer can be traced to the code that produced it. */
export const ENGINE_VERSION = `scrubwright-engine ${pkg.version}`
