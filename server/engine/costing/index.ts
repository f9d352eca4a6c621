/** Cost model: public surface. */
export * from './correlations.ts'
export * from './costDesign.ts'
export { listPresets, loadPreset, hasPreset, DEFAULT_PRESET, type PresetInfo } from './presets.ts'
export { costingReferences, type CostingReferenceKey, type Reference } from './references.ts'
