// The upload widget's checks before sending and its reading of the server's answers. The error
// shape is the app's one ({ error: { code, message, fields? } }, lib/errors.ts); the accepted
// endings are PRODUCT.md's list (.nc .ngc .tap .gcode .cnc .txt); 413 and 401/403 are read as
// RFC 9110 §15.5.14, §15.5.2 and §15.5.4 define them.
import { describe, expect, it } from 'vitest';
import { checkBeforeSending, uploadErrorMessage } from '@/lib/jobs/upload-request';

const MiB = 1024 * 1024;

describe('checkBeforeSending', () => {
  it("takes PRODUCT.md's endings in any case", () => {
    for (const name of ['a.nc', 'b.NGC', 'c.tap', 'd.GCode', 'e.cnc', 'f.txt']) expect(checkBeforeSending({ name, size: 10 }, MiB), name).toBeNull();
  });

  it('refuses another ending, an empty file and one over the limit, naming the file', () => {
    expect(checkBeforeSending({ name: 'brackets.dxf', size: 10 }, MiB)).toContain('brackets.dxf');
    expect(checkBeforeSending({ name: 'brackets.nc', size: 0 }, MiB)).toBe('"brackets.nc" is empty: there is no program in it.');
    expect(checkBeforeSending({ name: 'big.nc', size: 150 * MiB }, 100 * MiB)).toBe('"big.nc" is 150 MiB; the largest program the server takes is 100 MiB.');
    expect(checkBeforeSending({ name: 'edge.nc', size: 100 * MiB }, 100 * MiB)).toBeNull();
  });
});

describe('uploadErrorMessage', () => {
  it("gives the server's own message, and its field messages after it", () => {
    const body = JSON.stringify({ error: { code: 'invalid:program', message: 'The file holds NUL bytes: it is not a G-code text.', fields: { file: ['Line 1 is binary.'] } } });
    expect(uploadErrorMessage(422, body)).toBe('The file holds NUL bytes: it is not a G-code text. Line 1 is binary.');
  });

  it('reads the status when the answer is not the error shape', () => {
    expect(uploadErrorMessage(413, '<html>Too large</html>')).toBe('The file is larger than the server takes.');
    expect(uploadErrorMessage(0, '')).toMatch(/connection to the server was lost/);
    expect(uploadErrorMessage(403, '')).toBe('Your role does not allow uploading programs.');
    expect(uploadErrorMessage(502, 'Bad gateway')).toBe('The server answered 502 and did not store the file. Try again.');
  });
});
