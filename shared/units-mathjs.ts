/**
 * Installs mathjs as the parser for units outside the built-in table (shared/units.ts).
 * The browser imports this lazily; Node loads mathjs by itself on first need.
 */
import { create, createUnitDependencies, unitDependencies } from 'mathjs'
import { mathjsFallback, setUnitFallback, type MathjsModule } from './units.ts'

export function installMathjsUnits(): void {
  setUnitFallback(mathjsFallback({ create, unitDependencies, createUnitDependencies } as unknown as MathjsModule))
}
