/**
 * Vuetify: the Scrubwright theme (calm, legible, semantic colour names) and global defaults.
 * This is the only file that holds colour values; components use the names.
 */
import 'vuetify/styles'
import { createVuetify, type ThemeDefinition } from 'vuetify'
import { aliases, mdi } from 'vuetify/iconsets/mdi-svg'

export const scrubwrightLight: ThemeDefinition = {
  dark: false,
  colors: {
    background: '#F3F5F4',
    surface: '#FFFFFF',
    'surface-variant': '#2B3A3F',
    'on-surface-variant': '#EEF2F1',
    primary: '#1D5C6B',
    secondary: '#56707A',
    accent: '#7A5C2E',
    error: '#A8322D',
    info: '#2C6185',
    success: '#2F6B45',
    warning: '#8A5A00',
    focus: '#C77700',
    highlight: '#F2D98A',
    // study status
    draft: '#56707A',
    'in-review': '#2C6185',
    approved: '#2F6B45',
    returned: '#8A5A00',
    archived: '#7D8587',
    // check verdicts
    pass: '#2F6B45',
    warn: '#8A5A00',
    fail: '#A8322D',
    // chart series
    'chart-1': '#1D5C6B',
    'chart-2': '#C77700',
    'chart-3': '#6C4F8C',
    'chart-4': '#3F8F6B',
    'chart-5': '#B5484D',
    'chart-6': '#5B7FA6',
    'chart-7': '#8C7A3E',
    'chart-8': '#9A9F9E',
    'chart-capital': '#1D5C6B',
    'chart-operating': '#C77700',
    'chart-equilibrium': '#A8322D',
    'chart-operating-line': '#1D5C6B',
    'chart-steps': '#C77700',
    'chart-optimum': '#A8322D',
    'chart-low': '#5B7FA6',
    'chart-high': '#C77700',
  },
  // Secondary text (labels, hints, subtitles) dimmed this far still reads at 4.5:1 or better
  // against white and the page background (WCAG 2 AA contrast); Vuetify's 0.6 does not once
  // a label and its field both dim.
  variables: {
    'medium-emphasis-opacity': 0.78,
  },
}

export function makeVuetify() {
  return createVuetify({
    theme: { defaultTheme: 'scrubwrightLight', themes: { scrubwrightLight } },
    icons: { defaultSet: 'mdi', aliases, sets: { mdi } },
    defaults: {
      VTextField: { variant: 'outlined', density: 'compact', color: 'primary', hideDetails: 'auto' },
      VTextarea: { variant: 'outlined', density: 'compact', color: 'primary', hideDetails: 'auto', rows: 2 },
      VSelect: { variant: 'outlined', density: 'compact', color: 'primary', hideDetails: 'auto' },
      VAutocomplete: { variant: 'outlined', density: 'compact', color: 'primary', hideDetails: 'auto' },
      VCombobox: { variant: 'outlined', density: 'compact', color: 'primary', hideDetails: 'auto' },
      VCheckbox: { density: 'compact', color: 'primary', hideDetails: 'auto' },
      VSwitch: { density: 'compact', color: 'primary', hideDetails: 'auto', inset: true },
      VBtn: { rounded: 'md' },
      VCard: { rounded: 'lg', elevation: 0, border: true },
      VAlert: { variant: 'tonal', density: 'compact' },
      VChip: { size: 'small', variant: 'tonal' },
      VDataTable: { density: 'comfortable', hover: true },
      VDataTableServer: { density: 'comfortable', hover: true },
      VTable: { density: 'compact' },
    },
  })
}
