// worker_threads do not inherit the parent's TypeScript loader (tsx, vitest): register tsx in this
// thread, then load the real worker. Plain JavaScript so that Node can start it without a loader.
import { tsImport } from 'tsx/esm/api';

await tsImport('./pool-worker.ts', import.meta.url);
