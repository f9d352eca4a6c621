/**
 * Reading large batch files in constant memory: the file is read in chunks and only the values
 * the caller asks for (one case at a time) are held. Three shapes: { "cases": [...], ... } (the
 * other members, e.g. "costBasis", may come before or after the cases: they are read in a first
 * pass), a bare array of cases, and NDJSON (one case per line).
 */
import { closeSync, openSync, readSync } from 'node:fs'

const CHUNK = 1 << 20
const QUOTE = 0x22
const BACKSLASH = 0x5c
const OPEN_OBJ = 0x7b
const CLOSE_OBJ = 0x7d
const OPEN_ARR = 0x5b
const CLOSE_ARR = 0x5d
const COMMA = 0x2c
const COLON = 0x3a
const NL = 0x0a

const isSpace = (c: number) => c === 0x20 || c === NL || c === 0x0d || c === 0x09

/** Calls fn with each chunk of the file (the buffer is reused: copy what you keep). */
export function readChunks(file: string, fn: (buf: Buffer) => void): void {
  const fd = openSync(file, 'r')
  try {
    const buf = Buffer.allocUnsafe(CHUNK)
    for (;;) {
      const n = readSync(fd, buf, 0, CHUNK, null)
      if (n <= 0) break
      fn(buf.subarray(0, n))
    }
  } finally {
    closeSync(fd)
  }
}

/** The first bytes of a file (to tell its shape). */
export function readHead(file: string, bytes = 1 << 16): Buffer {
  const fd = openSync(file, 'r')
  try {
    const buf = Buffer.alloc(bytes)
    const n = readSync(fd, buf, 0, bytes, 0)
    return buf.subarray(0, n)
  } finally {
    closeSync(fd)
  }
}

/** Each line of the file (without its end of line), with its index. */
export function forEachLine(file: string, fn: (line: string, index: number) => void): void {
  let rest: Buffer | null = null
  let index = 0
  readChunks(file, (chunk) => {
    let start = 0
    for (let i = chunk.indexOf(NL); i >= 0; i = chunk.indexOf(NL, start)) {
      const piece = rest ? Buffer.concat([rest, chunk.subarray(start, i)]) : chunk.subarray(start, i)
      rest = null
      fn(piece.toString('utf8').replace(/\r$/, ''), index++)
      start = i + 1
    }
    if (start < chunk.length) rest = rest ? Buffer.concat([rest, chunk.subarray(start)]) : Buffer.from(chunk.subarray(start))
  })
  if (rest !== null && (rest as Buffer).length > 0) fn((rest as Buffer).toString('utf8').replace(/\r$/, ''), index)
}

export type Parent = '{' | '[' | ''

/** What a scan keeps: `want` is asked at the start of every value; `value` receives the kept ones. */
export interface ScanHandler {
  /** depth: containers around the value; parent: the innermost one; key: the member name at depth 1. */
  want(depth: number, parent: Parent, key: string | null, firstByte: number): boolean
  value(text: string, depth: number, parent: Parent, key: string | null): void
}

/**
 * A byte-level scan of JSON text (structure only: strings, nesting, members); the kept values
 * are handed over as text for JSON.parse. Throws when the file ends inside a value.
 */
export function scanJson(file: string, h: ScanHandler): void {
  const stack: number[] = []
  let inStr = false
  let esc = false
  let expectValue = true
  let expectKey = false
  let collectingKey = false
  let keyParts: Buffer[] = []
  let keyStartAt = 0
  let pendingKey: string | null = null
  let key1: string | null = null
  let cap: { depth: number; kind: 'container' | 'string' | 'scalar'; parent: Parent; key: string | null; parts: Buffer[]; start: number } | null = null

  const parentOf = (): Parent => (stack.length === 0 ? '' : stack[stack.length - 1] === OPEN_OBJ ? '{' : '[')
  const start = (i: number, kind: 'container' | 'string' | 'scalar', first: number) => {
    expectValue = false
    const depth = stack.length
    const parent = parentOf()
    const key = depth === 1 && parent === '{' ? key1 : depth >= 2 ? key1 : null
    if (h.want(depth, parent, key, first)) cap = { depth, kind, parent, key, parts: [], start: i }
  }
  let chunkRef: Buffer = Buffer.alloc(0)
  const end = (i: number) => {
    const c = cap!
    c.parts.push(chunkRef.subarray(c.start, i))
    cap = null
    h.value(Buffer.concat(c.parts).toString('utf8'), c.depth, c.parent, c.key)
  }

  readChunks(file, (chunk) => {
    chunkRef = chunk
    if (cap) cap.start = 0
    for (let i = 0; i < chunk.length; i++) {
      const c = chunk[i]!
      if (inStr) {
        if (esc) esc = false
        else if (c === BACKSLASH) esc = true
        else if (c === QUOTE) {
          inStr = false
          if (collectingKey) {
            keyParts.push(chunk.subarray(keyStartAt, i))
            collectingKey = false
            try {
              pendingKey = JSON.parse('"' + Buffer.concat(keyParts).toString('utf8') + '"') as string
            } catch {
              pendingKey = null
            }
            keyParts = []
          } else if (cap && cap.kind === 'string' && stack.length === cap.depth) end(i + 1)
        }
        continue
      }
      if (cap && cap.kind === 'scalar' && (isSpace(c) || c === COMMA || c === CLOSE_ARR || c === CLOSE_OBJ)) end(i)
      if (isSpace(c)) continue
      switch (c) {
        case OPEN_OBJ:
        case OPEN_ARR:
          if (expectValue || stack.length === 0) start(i, 'container', c)
          stack.push(c)
          expectValue = c === OPEN_ARR
          expectKey = c === OPEN_OBJ
          break
        case CLOSE_OBJ:
        case CLOSE_ARR:
          stack.pop()
          expectKey = false
          expectValue = stack.length === 0
          if (cap && cap.kind === 'container' && stack.length === cap.depth) end(i + 1)
          break
        case COMMA:
          if (stack.length === 1) key1 = null
          if (parentOf() === '[') expectValue = true
          else expectKey = true
          break
        case COLON:
          if (stack.length === 1) key1 = pendingKey
          expectValue = true
          break
        case QUOTE:
          inStr = true
          if (expectKey) {
            expectKey = false
            collectingKey = stack.length === 1
            keyStartAt = i + 1
            keyParts = []
          } else if (expectValue || stack.length === 0) start(i, 'string', c)
          break
        default:
          if (expectValue || stack.length === 0) start(i, 'scalar', c)
      }
    }
    // keep what the next chunk continues
    if (cap) cap.parts.push(Buffer.from(chunk.subarray(cap.start)))
    if (collectingKey) {
      keyParts.push(Buffer.from(chunk.subarray(keyStartAt)))
      keyStartAt = 0
    }
  })
  if (cap && (cap as { kind: string }).kind === 'scalar') {
    chunkRef = Buffer.alloc(0)
    ;(cap as { start: number }).start = 0
    end(0)
  }
  if (stack.length > 0 || inStr) throw new Error('the file ends inside a value')
}
