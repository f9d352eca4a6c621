/** The built-in component library (data/components.json), on its own so a reader that needs no schema can import it. */
import type { ComponentLibrary } from './library.ts'
import componentsJson from '../../../data/components.json' with { type: 'json' }

export const COMPONENT_LIBRARY: ComponentLibrary = componentsJson as unknown as ComponentLibrary
