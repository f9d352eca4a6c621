import { useTheme } from 'vuetify'

/** Chart colours come from the theme (semantic names), never from components. */
export function useChartColors() {
  const theme = useTheme()
  return (name: string): string => {
    const colors = theme.current.value.colors as Record<string, unknown>
    const c = colors[name] ?? colors.primary
    return typeof c === 'string' ? c : 'currentColor'
  }
}

export const SERIES_COLOURS = ['chart-1', 'chart-2', 'chart-3', 'chart-4', 'chart-5', 'chart-6', 'chart-7', 'chart-8']
