import 'server-only';
// A program upload request, streamed: busboy parses the multipart/form-data body and each
// `file` part flows through ProgramMeter (SHA-256, bytes, lines, the CLI's program-text check,
// the PROGRAM_MAX_BYTES limit) straight into object storage. Nothing of a file is buffered
// beyond the storage upload's parts in flight.
//
// All or nothing per request: when any part is refused (bad name, empty, blank, binary, over
// the limit) or the request breaks off, every object this request stored is deleted and the
// refusal is thrown; the caller writes rows only after receivePrograms resolved, and deletes
// the objects (discardReceived) when that write fails. So no request leaves half of its files
// behind, and a refused file never leaves an object or a row.
//
// After a refusal the rest of the body is still read (and thrown away, never stored) up to
// PROGRAM_MAX_BYTES more, so that a browser, which sends the whole body before it reads the
// answer, gets the message; beyond that the answer goes out at once and the connection closes.
import busboy, { type Busboy, type FileInfo } from 'busboy';
import { randomUUID } from 'node:crypto';
import { Readable } from 'node:stream';
import type { ReadableStream as NodeWebReadableStream } from 'node:stream/web';
import { AppError } from '@/lib/errors';
import { ProgramMeter, ProgramRefusedError, ProgramTooLargeError } from './program-meter';
import { checkProgramName, PROGRAM_EXTENSIONS, programObjectKey } from './program-names';
import { deleteProgramObjects, uploadProgramObject } from './program-storage';

/** the most program files one request may carry */
export const MAX_FILES_PER_REQUEST = 20;

export interface ReceivedProgram {
  name: string;
  objectKey: string;
  sha256: string;
  bytes: number;
  lines: number;
}

export interface ReceiveOptions {
  shopId: number;
  jobId: number;
  maxBytes: number;
  maxFiles?: number;
}

export interface ReceiveResult {
  programs: ReceivedProgram[];
}

/** What the route needs to know after a refusal: was the body read to its end? */
export interface ReceiveState {
  bodyComplete: boolean;
}

const fileError = (code: 'invalid:file' | 'too-large:file', message: string) => new AppError(code, message, { file: [message] });

function refusalFor(err: unknown, name: string): AppError {
  if (err instanceof ProgramTooLargeError) {
    return fileError('too-large:file', `Cannot use program "${name}": ${err.message} Nothing from this upload was stored.`);
  }
  if (err instanceof ProgramRefusedError) return fileError('invalid:file', `Cannot use program "${name}": ${err.refusal.message}`);
  if (err instanceof AppError) return err;
  console.error('[kerfcast] program upload: storing a file failed', err);
  return new AppError('internal:storage', `"${name}" could not be stored; nothing from this upload was kept. Try again.`);
}

const brokenOff = () => new AppError('invalid:body', 'The upload broke off before its end; nothing from it was stored.');

/**
 * Reads every `file` part of the request into object storage and returns what was stored,
 * in the order of the parts; throws the refusal (AppError) after deleting whatever it stored.
 */
export async function receivePrograms(request: Request, options: ReceiveOptions, state: ReceiveState = { bodyComplete: false }): Promise<ReceiveResult> {
  const contentType = request.headers.get('content-type') ?? '';
  if (!/^multipart\/form-data\s*;/i.test(contentType) || !request.body) {
    state.bodyComplete = !request.body;
    throw new AppError('invalid:body', 'Send the programs as multipart/form-data, one part named "file" for each program file.');
  }
  const maxFiles = options.maxFiles ?? MAX_FILES_PER_REQUEST;
  let parser: Busboy;
  try {
    parser = busboy({
      headers: { 'content-type': contentType },
      // browsers send a file name's UTF-8 bytes as they are (WHATWG HTML, multipart/form-data encoding)
      defParamCharset: 'utf8',
      // one byte over the limit reaches the meter, which refuses the file; busboy skips the rest
      limits: { files: maxFiles, fields: 20, fieldSize: 8 * 1024, parts: maxFiles + 20, fileSize: options.maxBytes + 1 },
    });
  } catch {
    state.bodyComplete = false;
    throw new AppError('invalid:body', 'The multipart/form-data body has no boundary; send it as a browser form does.');
  }

  const source = Readable.fromWeb(request.body as unknown as NodeWebReadableStream<Uint8Array>);
  const keys: string[] = [];
  const slots: (ReceivedProgram | null)[] = [];
  const work: Promise<void>[] = [];
  let failure: AppError | null = null;
  let drained = 0;
  let settle!: () => void;
  const parsed = new Promise<void>((resolve) => (settle = resolve));

  const fail = (error: AppError) => {
    failure ??= error;
  };

  const onFile = (field: string, file: Readable, info: FileInfo) => {
    if (failure) return void file.resume();
    if (field !== 'file') {
      fail(new AppError('invalid:body', `The part "${field}" is not taken: send each program file as a part named "file".`));
      return void file.resume();
    }
    const checked = checkProgramName(info.filename ?? '');
    if (!checked.ok) {
      fail(fileError('invalid:file', checked.message));
      return void file.resume();
    }
    const name = checked.name;
    const key = programObjectKey(options.shopId, options.jobId, randomUUID());
    keys.push(key);
    const slot = slots.push(null) - 1;
    const meter = new ProgramMeter(options.maxBytes);
    let meterError: unknown = null;
    let brokeOff = false;
    // a refused file: stop feeding the meter and let busboy run on to the next part
    const release = () => {
      file.unpipe(meter);
      file.resume();
    };
    meter.on('error', (err) => {
      meterError = err;
      release();
    });
    // busboy destroys the part's stream when the request breaks off mid-part
    file.on('error', (err) => {
      brokeOff = true;
      meter.destroy(err);
    });
    file.pipe(meter);
    work.push(
      uploadProgramObject(key, meter).then(
        () => {
          const m = meter.measure;
          if (!m) throw new Error('upload finished before the file was measured');
          slots[slot] = { name, objectKey: key, sha256: m.sha256, bytes: m.bytes, lines: m.lines };
        },
        (err: unknown) => {
          // storage gave up while the file was still arriving: read the rest away
          if (!meter.writableFinished) {
            meter.destroy();
            release();
          }
          fail(brokeOff ? brokenOff() : refusalFor(meterError ?? err, name));
        },
      ),
    );
  };

  parser.on('file', onFile);
  parser.on('filesLimit', () => fail(new AppError('invalid:body', `At most ${maxFiles} program files can be sent at once; send the rest in another upload.`)));
  parser.on('partsLimit', () => fail(new AppError('invalid:body', 'The form has too many parts; send only the program files.')));
  parser.on('fieldsLimit', () => fail(new AppError('invalid:body', 'The form has too many fields; send only the program files.')));
  parser.on('close', settle);
  parser.on('error', () => {
    fail(brokenOff());
    settle();
  });
  source.on('end', () => {
    state.bodyComplete = true;
  });
  source.on('error', (err) => parser.destroy(err));
  // the client went away: Next.js aborts the request's signal
  const onAbort = () => parser.destroy(new Error('the request was aborted'));
  request.signal?.addEventListener('abort', onAbort, { once: true });
  source.on('data', (chunk: Buffer) => {
    if (!failure) return;
    drained += chunk.length;
    // read away at most one more file's worth after a refusal, then answer
    if (drained > options.maxBytes) {
      source.unpipe(parser);
      source.pause();
      // ends the part being read, so its storage upload gives up too
      parser.destroy(new Error('the rest of a refused upload was not read'));
    }
  });
  source.pipe(parser);

  try {
    await parsed;
    await Promise.allSettled(work);
  } finally {
    request.signal?.removeEventListener('abort', onAbort);
  }
  if (!failure && slots.length === 0) {
    fail(new AppError('invalid:body', `The upload holds no program file: add one or more files ending in ${PROGRAM_EXTENSIONS.join(' ')}.`));
  }
  if (failure) {
    await discardKeys(keys);
    throw failure;
  }
  return { programs: slots as ReceivedProgram[] };
}

async function discardKeys(keys: string[]): Promise<void> {
  if (keys.length === 0) return;
  try {
    await deleteProgramObjects(keys);
  } catch (err) {
    // the refusal still stands; the log names what is left for an operator to remove
    console.error('[kerfcast] program upload: could not delete stored objects', keys, err);
  }
}

/** Deletes the objects of received programs whose rows could not be written. */
export function discardReceived(received: ReceiveResult): Promise<void> {
  return discardKeys(received.programs.map((p) => p.objectKey));
}

/** How much of an unread body a refusal before the upload reads away, so the client sees the answer. */
export const REFUSAL_DRAIN_BYTES = 1024 * 1024;

/**
 * After a refusal that came before the body was read (signed out, wrong role, no such job):
 * reads and drops the body when it is small, so the client, still sending, gets the answer
 * instead of a broken pipe and the connection can be reused. True when the body was read
 * to its end; false when it is larger than `limitBytes` (the caller then closes the connection).
 */
export async function drainUnreadBody(request: Request, limitBytes: number = REFUSAL_DRAIN_BYTES): Promise<boolean> {
  if (!request.body || request.bodyUsed) return !request.body;
  const declared = Number(request.headers.get('content-length') ?? NaN);
  if (Number.isFinite(declared) && declared > limitBytes) return false;
  const reader = request.body.getReader();
  let seen = 0;
  try {
    for (;;) {
      const { done, value } = await reader.read();
      if (done) return true;
      seen += value.byteLength;
      if (seen > limitBytes) {
        await reader.cancel().catch(() => undefined);
        return false;
      }
    }
  } catch {
    return false;
  }
}
