// Node worker-thread entry of the server's estimate pool (piscina). A thin shell: the work is
// lib/estimate-server/worker-task.ts. Bundled by scripts/build-estimate-worker.mjs into
// .next/kerfcast/estimate-worker.cjs, the file the pool loads under `next start`.
import { estimateTask } from '@/lib/estimate-server/worker-task';

export default estimateTask;
