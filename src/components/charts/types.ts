/** One series of an axis chart: points as [x, y] pairs or {x, y} objects. */
export interface ChartSeriesItem {
  name: string
  type?: 'line' | 'bar' | 'scatter' | 'area'
  color?: string
  data: (number | null | [number, number | null] | { x: number | string; y: number | null; [k: string]: unknown })[]
}

export type ChartSeries = ChartSeriesItem[]
