/** The DOM id of the input of a case field (links from the list of problems focus it). */
export function fieldId(path: string): string {
  return `field-${path.replace(/[^a-zA-Z0-9]+/g, '-')}`
}
