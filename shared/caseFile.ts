/**
 * The command line's JSON case file (what `npm run design -- FILE.json` reads, see
 * data/examples/) as a study's export and import: one case object with its "name" and
 * "description" at the top, the inputs beside them. Import checks the file with the shared case
 * schema and answers every problem with its field path at once.
 *
 *   caseFileText({ name: 'Vent scrubber', description: '', inputs })  -> '{\n  "name": "Vent scrubber", ...'
 *   readCaseFile('{"gas": {"flow": -3}}')  -> { ok: false, problems: [{ path: 'gas.flow', message: ... }, ...] }
 */
import { caseSchema, type CaseInput } from './schemas/case.ts'

export interface CaseFileProblem {
  /** Field path in the file ('gas.flow'), or '' for the file as a whole. */
  path: string
  message: string
}

export type CaseFileRead =
  | { ok: true; name: string; description: string; inputs: CaseInput }
  | { ok: false; problems: CaseFileProblem[] }

/** Keys of a case file that describe the file rather than the case. */
const FILE_KEYS = ['name', 'description', 'id'] as const

/** The study as a case file: pretty-printed JSON, name and description first. */
export function caseFileText(study: { name: string; description?: string | null; inputs: Record<string, unknown> }): string {
  const inputs: Record<string, unknown> = { ...study.inputs }
  for (const k of FILE_KEYS) delete inputs[k]
  const file = { name: study.name, ...(study.description ? { description: study.description } : {}), ...inputs }
  return `${JSON.stringify(file, null, 2)}\n`
}

/** A file name for the case file of a study: letters, digits and hyphens, '.json'. */
export function caseFileName(name: string): string {
  const stem = name
    .normalize('NFKD')
    .replace(/[^\w\s-]/g, '')
    .trim()
    .replace(/[\s_]+/g, '-')
    .replace(/-+/g, '-')
    .toLowerCase()
    .slice(0, 80)
  return `${stem || 'study'}.json`
}

/**
 * Read a case file for a new study. A batch ({ "cases": [...] } or an array) is refused with the
 * number of cases it holds; the study's name is the file's "name", else `fallbackName`.
 */
export function readCaseFile(text: string, fallbackName = 'Imported case'): CaseFileRead {
  let raw: unknown
  try {
    raw = JSON.parse(text.replace(/^\uFEFF/, ''))
  } catch (e) {
    return { ok: false, problems: [{ path: '', message: `The file is not valid JSON: ${(e as Error).message}` }] }
  }
  if (Array.isArray(raw) || (typeof raw === 'object' && raw !== null && 'cases' in raw)) {
    const cases = Array.isArray(raw) ? raw : (raw as { cases: unknown }).cases
    const n = Array.isArray(cases) ? cases.length : 0
    return { ok: false, problems: [{ path: '', message: `The file is a batch of ${n} case${n === 1 ? '' : 's'}; a study starts from one case. Save one case of it as its own file.` }] }
  }
  if (typeof raw !== 'object' || raw === null) return { ok: false, problems: [{ path: '', message: 'The file must hold one case: a JSON object with gas, solute, solvent, equilibrium, recovery and solventFactor.' }] }
  const parsed = caseSchema.safeParse(raw)
  if (!parsed.success) {
    const words = (i: { code: string; message: string }) => (i.code === 'invalid_type' && /received undefined$/.test(i.message) ? 'is required' : i.message)
    return { ok: false, problems: parsed.error.issues.map((i) => ({ path: i.path.map(String).join('.'), message: words(i) })) }
  }
  const obj = parsed.data as Record<string, unknown>
  const name = typeof obj.name === 'string' && obj.name.trim() ? obj.name.trim().slice(0, 160) : fallbackName
  const description = typeof obj.description === 'string' ? obj.description.slice(0, 5000) : ''
  const inputs: Record<string, unknown> = { ...obj }
  for (const k of FILE_KEYS) delete inputs[k]
  return { ok: true, name, description, inputs: inputs as CaseInput }
}
