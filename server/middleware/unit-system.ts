import { AsyncLocalStorage } from 'node:async_hooks'
import type { RequestHandler } from 'express'
import { setUnitSystemSource, type ShowSystem } from '../../shared/schemas/caseRules.ts'

/**
 * The person's unit system for the messages of one request: the client names it in the
 * X-Unit-System header (SI or US); without it, messages use the case units (kmol/h, °C, kPa).
 * Case-field messages built while the request runs (shared/schemas/caseRules.ts) read it here.
 */
const store = new AsyncLocalStorage<ShowSystem>()
setUnitSystemSource(() => store.getStore() ?? null)

export const UNIT_SYSTEM_HEADER = 'X-Unit-System'

export const unitSystem: RequestHandler = (req, _res, next) => {
  const h = req.get(UNIT_SYSTEM_HEADER)?.trim().toUpperCase()
  if (h === 'SI' || h === 'US') store.run(h, next)
  else next()
}
