// What a program upload's file name may be, and the two places a name meets the outside:
// the object key (which never holds the name: it is built from ids and a random id only)
// and the Content-Disposition header of a download (where the name is escaped, RFC 6266
// with the RFC 8187 UTF-8 form). Pure: no Node modules.

/** the endings PRODUCT.md lists for G-code programs, compared case-insensitively */
export const PROGRAM_EXTENSIONS = ['.nc', '.ngc', '.tap', '.gcode', '.cnc', '.txt'] as const;
/** the length of programs.name (db/schema.ts) */
export const PROGRAM_NAME_MAX_CHARS = 200;

export type ProgramNameCheck = { ok: true; name: string } | { ok: false; message: string };

// C0 controls, DEL and the C1 controls: they never belong in a file name and would break
// the one-line history entries and headers the name is shown in.
const CONTROL = /[\u0000-\u001f\u007f-\u009f]/;

/**
 * The name a program is stored under: the file name the browser sent, with any folder part
 * dropped (some browsers send a full path), white space trimmed and Unicode in composed form
 * (NFC), so the same file picked on two systems is the same program. Refused when empty,
 * longer than 200 characters, holding control characters or without an accepted ending.
 */
export function checkProgramName(raw: string): ProgramNameCheck {
  const base = raw.split(/[\\/]/).pop() ?? '';
  const name = base.normalize('NFC').trim();
  if (name === '') return { ok: false, message: 'The file has no name; give it a name ending in .nc, .ngc, .tap, .gcode, .cnc or .txt.' };
  if (CONTROL.test(name)) return { ok: false, message: 'The file name holds control characters; rename the file.' };
  // counted in code points, as MariaDB counts the characters of a VARCHAR(200)
  const chars = [...name].length;
  if (chars > PROGRAM_NAME_MAX_CHARS) {
    return { ok: false, message: `The file name is ${chars} characters long; at most ${PROGRAM_NAME_MAX_CHARS} are kept, so shorten it.` };
  }
  const lower = name.toLowerCase();
  if (!PROGRAM_EXTENSIONS.some((ext) => lower.endsWith(ext) && lower.length > ext.length)) {
    return { ok: false, message: `"${name}" does not end in ${PROGRAM_EXTENSIONS.join(' ')}: only G-code program files are taken.` };
  }
  return { ok: true, name };
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/;

function positiveInt(value: number, what: string): number {
  if (!Number.isSafeInteger(value) || value <= 0) throw new Error(`${what} must be a positive integer, not ${value}`);
  return value;
}

/**
 * Where an uploaded program's bytes are stored. The row ids and the version are known only
 * once the rows are written, after the bytes are in, so the key is made of the shop, the job
 * and a random UUID (v4, from the caller) and the row records it. The file name is never
 * part of it, so no name can reach another path, shop or bucket.
 */
export function programObjectKey(shopId: number, jobId: number, uploadId: string): string {
  if (!UUID.test(uploadId)) throw new Error(`upload id must be a lower-case UUID, not ${JSON.stringify(uploadId)}`);
  return `shops/${positiveInt(shopId, 'shop id')}/jobs/${positiveInt(jobId, 'job id')}/programs/${uploadId}.nc`;
}

/** RFC 8187 §3.2 value-chars: attr-char, everything else percent-encoded from UTF-8 */
function rfc8187(value: string): string {
  return encodeURIComponent(value).replace(/['()*]/g, (c) => `%${c.charCodeAt(0).toString(16).toUpperCase()}`);
}

/**
 * Content-Disposition for a stored program sent back (RFC 6266 §4.1): a plain ASCII
 * `filename` for old clients (anything outside printable ASCII, quotes and backslashes
 * replaced by "_") and `filename*` with the exact name in UTF-8.
 */
export function programContentDisposition(name: string, disposition: 'inline' | 'attachment' = 'attachment'): string {
  const fallback = name.replace(/[^\x20-\x7e]|["\\%]/gu, '_');
  return `${disposition}; filename="${fallback}"; filename*=UTF-8''${rfc8187(name)}`;
}
