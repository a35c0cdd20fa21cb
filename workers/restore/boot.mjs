// Entry of a restoration thread. Node 20 does not pass tsx's module hooks on to worker threads,
// so the thread loads its TypeScript module through tsx's API itself.
import { workerData } from 'node:worker_threads';
import { tsImport } from 'tsx/esm/api';

await tsImport(workerData.entry, import.meta.url);
