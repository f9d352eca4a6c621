// Lint fixture (never built): closes the cycle CyclePanel.vue -> cycle-labels.ts -> CyclePanel.vue.
import CyclePanel from './CyclePanel.vue'

export const panelLabel = 'Panel'
export const panelComponent = CyclePanel
