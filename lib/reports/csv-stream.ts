// A CSV export as a streamed response body: the first batch is read before the answer starts
// (so a failing query still answers 500 in the error shape), then each pull of the reader
// fetches the next batch by id, so memory holds one batch however many rows the shop has and
// a slow client slows the reads (the stream's back-pressure).
import { csvText, type CsvColumn } from './csv';

export async function csvStream<T extends { id: number }>(
  columns: readonly CsvColumn<T>[],
  nextBatch: (afterId: number) => Promise<T[]>,
  onError: (error: unknown) => void,
): Promise<ReadableStream<Uint8Array>> {
  const encoder = new TextEncoder();
  let batch = await nextBatch(0);
  let first = true;
  let done = false;
  return new ReadableStream<Uint8Array>({
    async pull(controller) {
      try {
        if (done) {
          controller.close();
          return;
        }
        const text = csvText(columns, batch, first);
        first = false;
        if (batch.length === 0) {
          done = true;
          if (text) controller.enqueue(encoder.encode(text));
          controller.close();
          return;
        }
        controller.enqueue(encoder.encode(text));
        batch = await nextBatch(batch[batch.length - 1].id);
      } catch (error) {
        onError(error);
        controller.error(error);
      }
    },
  });
}
