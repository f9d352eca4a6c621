/** The component library: its types, lookup by name or alias, and the merge of a site's own components over the shipped ones. */

export interface LibraryValue<T = number> {
  value: T
  unit?: string
  temperature?: number
  source: string
}
export interface LibraryComponent {
  aliases?: string[]
  cas?: string
  formula?: string
  molarMass?: LibraryValue
  henry?: { Hcp: number; B: number; source: string }
  antoine?: { A: number; B: number; C: number; Tmin: number; Tmax: number; source: string }
  gammaInfWater?: LibraryValue
  gasViscosity?: LibraryValue
  liquidCorrelations?: LibraryValue<string>
  notes?: LibraryValue<string>
  hazards?: { flags: string[]; source: string }
}
export interface ComponentLibrary {
  schemaVersion?: number
  description?: string
  components: Record<string, LibraryComponent>
}

/** Find a component by name or alias (case-insensitive). Returns [canonical name, data]. */
export function findComponent(lib: ComponentLibrary, name: string): [string, LibraryComponent] | null {
  const n = name.trim().toLowerCase()
  for (const key of Object.keys(lib.components)) {
    const c = lib.components[key]!
    if (key.toLowerCase() === n) return [key, c]
    if (c.aliases && c.aliases.some((a) => a.toLowerCase() === n)) return [key, c]
  }
  return null
}

/** A library with site components added (site entries replace library entries of the same name). */
export function mergeLibraries(base: ComponentLibrary, extra: ComponentLibrary | undefined): ComponentLibrary {
  if (!extra) return base
  return { ...base, components: { ...base.components, ...extra.components } }
}

// ---------------------------------------------------------------- CaseSI
