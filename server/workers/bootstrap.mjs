// Worker threads start without the TypeScript loader of the main thread: register it, then
// load the worker named in workerData.
import { workerData } from 'node:worker_threads'
import { register } from 'tsx/esm/api'

register()
await import(workerData.entry)
