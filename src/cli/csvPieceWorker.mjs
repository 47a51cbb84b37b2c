// Entry of a CSV piece worker thread (src/cli/csvLanes.ts): a worker thread does not inherit the
// TypeScript loader of the command line, so it registers tsx itself, then loads the worker.
import { register } from 'tsx/esm/api'

register()
await import('./csvPieceWorker.ts')
