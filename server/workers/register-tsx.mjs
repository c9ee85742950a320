// Preloaded into every worker-pool thread (see task-pool.ts): on Node 20, `--import tsx` registers its
// TypeScript loader on the main thread only, so a worker thread registers it through tsx's API.
import { register } from 'tsx/esm/api'

register()
