// The browser side of a program upload: one multipart request per file to
// POST /api/jobs/{jobId}/programs (one `file` part), sent with XMLHttpRequest because its
// upload.onprogress reports the bytes sent (fetch has no upload progress), cancellable, and
// the server's error shape ({ error: { code, message, fields? } }) turned into one sentence.
// One file per request: the route takes a request whole or not at all, so a bad file must not
// take the good ones down with it, and each file gets its own bar and its own cancel.
import { isErrorBody } from '@/lib/errors';
import { checkProgramName } from '@/lib/programs/program-names';
import type { UploadedProgram } from '@/db/queries/programs';
import { formatBytes } from './format';

/** One program of the upload's 201 answer, as db/queries/programs.ts makes it. */
export type UploadedProgramView = UploadedProgram;

export type UploadOutcome =
  | { ok: true; programs: UploadedProgramView[] }
  | { ok: false; cancelled: boolean; message: string };

export interface UploadHandle {
  done: Promise<UploadOutcome>;
  cancel(): void;
}

/** Checked before anything is sent: the name (same rule as the server) and the size limit. */
export function checkBeforeSending(file: { name: string; size: number }, maxBytes: number): string | null {
  const name = checkProgramName(file.name);
  if (!name.ok) return name.message;
  if (file.size === 0) return `"${file.name}" is empty: there is no program in it.`;
  if (file.size > maxBytes) return `"${file.name}" is ${formatBytes(file.size)}; the largest program the server takes is ${formatBytes(maxBytes)}.`;
  return null;
}

/** The sentence a failed upload shows: the server's own message (and its field messages), or what the status means. */
export function uploadErrorMessage(status: number, responseText: string): string {
  let body: unknown = null;
  try {
    body = JSON.parse(responseText);
  } catch {
    // not JSON: a proxy's page, or nothing at all
  }
  if (isErrorBody(body)) {
    const details = Object.values(body.error.fields ?? {}).flat().filter((m) => m !== body.error.message);
    return [body.error.message, ...details].join(' ');
  }
  if (status === 0) return 'The connection to the server was lost before the file was stored. Check the network and try again.';
  if (status === 401) return 'You are signed out. Sign in again, then upload the file again.';
  if (status === 403) return 'Your role does not allow uploading programs.';
  if (status === 413) return 'The file is larger than the server takes.';
  return `The server answered ${status} and did not store the file. Try again.`;
}

/** Sends one file; onProgress gets the file's bytes sent so far and its size. */
export function sendProgram(url: string, file: File, onProgress: (sentBytes: number, totalBytes: number) => void): UploadHandle {
  const xhr = new XMLHttpRequest();
  let cancelled = false;
  const done = new Promise<UploadOutcome>((resolve) => {
    xhr.upload.onprogress = (event) => {
      if (!event.lengthComputable || event.total === 0) return;
      // the request also carries the multipart framing; show the share of the file itself
      onProgress(Math.min(file.size, Math.round((event.loaded / event.total) * file.size)), file.size);
    };
    xhr.onload = () => {
      if (xhr.status === 201) {
        try {
          const body = JSON.parse(xhr.responseText) as { programs: UploadedProgramView[] };
          onProgress(file.size, file.size);
          resolve({ ok: true, programs: body.programs });
        } catch {
          resolve({ ok: false, cancelled: false, message: 'The server stored the file but its answer could not be read. Reload the page.' });
        }
        return;
      }
      resolve({ ok: false, cancelled: false, message: uploadErrorMessage(xhr.status, xhr.responseText) });
    };
    xhr.onerror = () => resolve({ ok: false, cancelled: false, message: uploadErrorMessage(0, '') });
    xhr.onabort = () => resolve({ ok: false, cancelled, message: cancelled ? 'Cancelled: nothing of this file was kept.' : uploadErrorMessage(0, '') });
  });
  const form = new FormData();
  form.append('file', file, file.name);
  xhr.open('POST', url);
  xhr.setRequestHeader('accept', 'application/json');
  xhr.send(form);
  return {
    done,
    cancel() {
      cancelled = true;
      xhr.abort();
    },
  };
}
