'use client';
// The viewer's worker from the page's side: one Web Worker per opened program (bundled by Next
// from workers/viewer-worker.ts), its progress as state, cancel by ending the worker (the engine
// runs synchronously inside it, so a message could not stop it sooner), and an error as a
// message with a retry. Nothing of the engine runs on the main thread.
import * as Comlink from 'comlink';
import { useCallback, useEffect, useRef, useState } from 'react';
import type { ViewerWorkerApi } from '@/workers/viewer-worker';
import { fromTransfer, type ReportChunk, type ViewerInput, type ViewerProgress, type ViewerResult } from '@/lib/viewer/view-run';

export type WorkerState =
  | { status: 'idle' }
  | { status: 'working'; progress: ViewerProgress }
  | { status: 'done'; result: ViewerResult; openedMs: number }
  | { status: 'cancelled' }
  | { status: 'failed'; message: string };

export function useViewerWorker() {
  const [state, setState] = useState<WorkerState>({ status: 'idle' });
  const workerRef = useRef<Worker | null>(null);
  const lastRef = useRef<{ file: Blob; input: ViewerInput } | null>(null);

  const stop = useCallback(() => {
    workerRef.current?.terminate();
    workerRef.current = null;
  }, []);

  const open = useCallback(
    (file: Blob, input: ViewerInput) => {
      stop();
      lastRef.current = { file, input };
      const started = performance.now();
      setState({ status: 'working', progress: { percent: 0, stage: 'Starting' } });
      const worker = new Worker(new URL('../../workers/viewer-worker.ts', import.meta.url), { type: 'module', name: 'kerfcast-viewer' });
      workerRef.current = worker;
      const api = Comlink.wrap<ViewerWorkerApi>(worker);
      const fail = (message: string) => {
        if (workerRef.current !== worker) return;
        stop();
        setState({ status: 'failed', message });
      };
      worker.addEventListener('error', (event) => fail(event.message || 'The viewer’s worker stopped with an error.'));
      // the report's long lists arrive in chunks ahead of the answer (view-run forTransfer)
      const chunks: ReportChunk[] = [];
      api
        .open(
          file,
          input,
          Comlink.proxy((progress: ViewerProgress) => {
            if (workerRef.current === worker) setState({ status: 'working', progress });
          }),
          Comlink.proxy((chunk: ReportChunk) => {
            chunks.push(chunk);
          }),
        )
        .then((result) => {
          if (workerRef.current !== worker) return;
          // the benchmark splits the main thread's long tasks at this mark
          performance.mark('kerfcast-viewer-result');
          stop();
          setState({ status: 'done', result: fromTransfer(result as ViewerResult, chunks), openedMs: performance.now() - started });
        })
        .catch((err: unknown) => fail(err instanceof Error ? err.message : String(err)));
    },
    [stop],
  );

  const cancel = useCallback(() => {
    stop();
    setState({ status: 'cancelled' });
  }, [stop]);

  const retry = useCallback(() => {
    if (lastRef.current) open(lastRef.current.file, lastRef.current.input);
  }, [open]);

  useEffect(() => stop, [stop]);

  return { state, open, cancel, retry };
}
