// Browser Web Worker of the 3D viewer, behind comlink: a thin shell around lib/viewer/view-run
// (which runs lib/estimate's runEstimate). The file arrives as a Blob (cloned by reference, not
// copied); every per-move array of the answer goes back transferred, never copied.
import * as Comlink from 'comlink';
import { forTransfer, openProgram, resultTransferables, type ReportChunk, type ViewerInput, type ViewerProgress, type ViewerResult } from '@/lib/viewer/view-run';

const api = {
  async open(file: Blob, input: ViewerInput, onProgress: (p: ViewerProgress) => void, onChunk: (c: ReportChunk) => Promise<void> | void): Promise<ViewerResult> {
    const bytes = new Uint8Array(await file.arrayBuffer());
    const { result, chunks } = forTransfer(await openProgram(bytes, input, (p) => void onProgress(p)));
    // one at a time and awaited: a proxied callback has its own channel, so only waiting for
    // each keeps them in order and ahead of the answer
    for (const c of chunks) await onChunk(c);
    return Comlink.transfer(result, resultTransferables(result));
  },
};

export type ViewerWorkerApi = typeof api;

Comlink.expose(api);
