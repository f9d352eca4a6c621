/** Read and write nested values by dotted path ("capital.installationFactors.shell"). */

type Obj = Record<string, unknown>

function isObj(v: unknown): v is Obj {
  return typeof v === 'object' && v !== null && !Array.isArray(v)
}

export function getAt(root: unknown, path: string): unknown {
  let cur: unknown = root
  for (const part of path.split('.')) {
    if (isObj(cur)) cur = cur[part]
    else if (Array.isArray(cur)) cur = cur[Number(part)]
    else return undefined
  }
  return cur
}

export function setAt(root: Obj, path: string, value: unknown): void {
  const parts = path.split('.')
  let cur: Obj = root
  for (let i = 0; i < parts.length - 1; i++) {
    const k = parts[i] as string
    const next = cur[k]
    if (!isObj(next)) cur[k] = {}
    cur = cur[k] as Obj
  }
  cur[parts[parts.length - 1] as string] = value
}

/** Leaf paths under a prefix: objects are walked, numbers/strings/booleans/arrays are leaves. */
export function leafPaths(root: unknown, prefix: string, stopAt: string[] = []): string[] {
  const out: string[] = []
  const walk = (v: unknown, path: string): void => {
    if (isObj(v) && !stopAt.includes(path)) {
      for (const k of Object.keys(v)) walk(v[k], `${path}.${k}`)
    } else {
      out.push(path)
    }
  }
  walk(getAt(root, prefix), prefix)
  return out
}

export function sameValue(a: unknown, b: unknown): boolean {
  return JSON.stringify(a) === JSON.stringify(b)
}
