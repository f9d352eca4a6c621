import pkg from '../../package.json' with { type: 'json' }

/**
 * The engine's version: the product's package version, defined here once. Stored with every run
 * so an old answer can be traced to the code that produced it.
 */
export const ENGINE_VERSION: string = pkg.version
