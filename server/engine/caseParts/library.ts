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
  const hit = nameIndex(lib).get(name.trim().toLowerCase())
  return hit ? [hit[0], hit[1]] : null
}

/**
 * Names and aliases (lower case) of the library's components, in library order: the first
 * component that has the name wins. Built once for the last library asked (the built-in one, or a
 * merged site library), not for every case.
 */
let lastIndex: { lib: ComponentLibrary; components: ComponentLibrary['components']; index: Map<string, readonly [string, LibraryComponent]> } | null = null
function nameIndex(lib: ComponentLibrary): Map<string, readonly [string, LibraryComponent]> {
  if (lastIndex && lastIndex.lib === lib && lastIndex.components === lib.components) return lastIndex.index
  const index = new Map<string, readonly [string, LibraryComponent]>()
  for (const key of Object.keys(lib.components)) {
    const c = lib.components[key]!
    const entry = [key, c] as const
    if (!index.has(key.toLowerCase())) index.set(key.toLowerCase(), entry)
    for (const a of c.aliases ?? []) if (!index.has(a.toLowerCase())) index.set(a.toLowerCase(), entry)
  }
  lastIndex = { lib, components: lib.components, index }
  return index
}

/** A library with site components added (site entries replace library entries of the same name). */
export function mergeLibraries(base: ComponentLibrary, extra: ComponentLibrary | undefined): ComponentLibrary {
  if (!extra) return base
  return { ...base, components: { ...base.components, ...extra.components } }
}

// ---------------------------------------------------------------- CaseSI
