/**
 * CSV for download: papaparse writes it (quotes, separators, line ends) with its formula guard on:
 * a text cell starting with = + - @ (or a tab or carriage return) gets a leading apostrophe, so a
 * spreadsheet shows it as text instead of running it. Numbers stay numbers.
 *
 *   toCsv([{ title: 'Study', value: (r) => r.name }], [{ name: '=1+1' }])  -> 'Study\r\n"\'=1+1"'
 */
import Papa from 'papaparse'

export interface CsvColumn<T> {
  title: string
  value: (row: T) => string | number | null | undefined
}

export function toCsv<T>(columns: CsvColumn<T>[], rows: T[]): string {
  return Papa.unparse(
    {
      fields: columns.map((c) => c.title),
      data: rows.map((r) => columns.map((c) => {
        const v = c.value(r)
        return v === null || v === undefined ? '' : v
      })),
    },
    { escapeFormulae: true, newline: '\r\n' },
  )
}

/** Offer text as a file download (a UTF-8 byte-order mark first for CSV, so spreadsheets read accents). */
export function downloadText(text: string, fileName: string, type: string): void {
  const bom = type.startsWith('text/csv') ? '\uFEFF' : ''
  const url = URL.createObjectURL(new Blob([bom + text], { type }))
  const a = document.createElement('a')
  a.href = url
  a.download = fileName
  document.body.appendChild(a)
  a.click()
  a.remove()
  setTimeout(() => URL.revokeObjectURL(url), 1000)
}
