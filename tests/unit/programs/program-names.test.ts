// File names of uploaded programs (lib/programs/program-names.ts): which names are taken, that
// no name (however hostile) reaches the object key, and the download header's escaping.
// References: RFC 6266 §4.1/§4.3 (filename and filename* in Content-Disposition), RFC 8187 §3.2
// (the ext-value UTF-8''percent-encoded form, attr-char set), RFC 9110 §5.5 (no CR, LF or NUL
// in a field value), Unicode NFC (UAX #15). The accepted endings are PRODUCT.md's list.
import { describe, expect, it } from 'vitest';
import { checkProgramName, PROGRAM_EXTENSIONS, programContentDisposition, programObjectKey } from '@/lib/programs/program-names';

const UUID = '3f2a9c1e-7b4d-4e8a-9f10-2c3d4e5f6a7b';

describe('checkProgramName', () => {
  it.each(PROGRAM_EXTENSIONS.flatMap((ext) => [`shelf-brackets${ext}`, `SHELF${ext.toUpperCase()}`]))('takes %s', (name) => {
    expect(checkProgramName(name)).toEqual({ ok: true, name });
  });

  it.each(['bracket.exe', 'bracket.nc.exe', 'bracket', '.nc', 'bracket.pdf', 'bracket.n c'])('refuses %s (not an accepted ending)', (name) => {
    const r = checkProgramName(name);
    expect(r.ok).toBe(false);
  });

  it.each([
    ['../../etc/passwd.nc', 'passwd.nc'],
    ['..\\..\\windows\\win.nc', 'win.nc'],
    ['C:\\jobs\\alder\\sides.tap', 'sides.tap'],
    ['/tmp/x/letters.gcode', 'letters.gcode'],
    ['  spaced name.nc  ', 'spaced name.nc'],
  ])('keeps only the last path part of %j', (raw, name) => {
    expect(checkProgramName(raw)).toEqual({ ok: true, name });
  });

  it('stores the composed (NFC) form, so the same name typed two ways is one program', () => {
    const decomposed = 'Tu\u0308r-seite.nc';
    const r = checkProgramName(decomposed);
    expect(r).toEqual({ ok: true, name: 'T\u00fcr-seite.nc' });
  });

  it.each(['bad\u0000.nc', 'line\nbreak.nc', 'cr\rname.nc', 'tab\tname.nc', 'del\u007f.nc', 'c1\u0085.nc'])('refuses control characters in %j', (name) => {
    const r = checkProgramName(name);
    expect(r.ok).toBe(false);
    expect(!r.ok && r.message).toMatch(/control characters/);
  });

  it('takes 200 characters and refuses 201, counting code points as MariaDB does', () => {
    const name200 = `${'a'.repeat(197)}.nc`;
    expect(checkProgramName(name200).ok).toBe(true);
    expect(checkProgramName(`b${name200}`).ok).toBe(false);
    // 197 astral characters are 394 UTF-16 units but 197 characters
    const astral = `${'\u{1F4D0}'.repeat(197)}.nc`;
    expect(astral.length).toBe(397);
    expect(checkProgramName(astral).ok).toBe(true);
  });

  it('refuses an empty or blank name', () => {
    expect(checkProgramName('').ok).toBe(false);
    expect(checkProgramName('   ').ok).toBe(false);
    expect(checkProgramName('folder/').ok).toBe(false);
  });
});

describe('programObjectKey', () => {
  it('is made of the shop, the job and the upload id only', () => {
    expect(programObjectKey(7, 42, UUID)).toBe(`shops/7/jobs/42/programs/${UUID}.nc`);
  });

  it('never holds the file name: hostile names change nothing about the key', () => {
    for (const raw of ['../../../shops/1/jobs/1/programs/x.nc', '%2e%2e%2fkey.nc', 'a?b#c.nc', '\u202Egnp.nc', 'x'.repeat(250) + '.nc']) {
      const checked = checkProgramName(raw);
      const key = programObjectKey(7, 42, UUID);
      if (checked.ok) expect(key).not.toContain(checked.name);
      expect(key).toMatch(/^shops\/7\/jobs\/42\/programs\/[0-9a-f-]{36}\.nc$/);
    }
  });

  it.each(['../../x', '', 'ABCDEF00-0000-4000-8000-000000000000', `${UUID}/../x`])('refuses %j as the upload id', (id) => {
    expect(() => programObjectKey(7, 42, id)).toThrow(/UUID/);
  });

  it.each([
    [0, 1],
    [1, 0],
    [-1, 1],
    [1.5, 1],
    [Number.NaN, 1],
  ])('refuses shop %s, job %s', (shopId, jobId) => {
    expect(() => programObjectKey(shopId, jobId, UUID)).toThrow(/positive integer/);
  });
});

describe('programContentDisposition (RFC 6266 with the RFC 8187 UTF-8 form)', () => {
  const parse = (header: string) => {
    const fallback = /filename="([^"]*)"/.exec(header)?.[1];
    const ext = /filename\*=UTF-8''([A-Za-z0-9!#$&+\-.^_`|~%]*)$/.exec(header)?.[1];
    return { fallback, exact: ext === undefined ? undefined : decodeURIComponent(ext) };
  };

  it.each([
    'shelf-brackets-birch-18mm.nc',
    'Regal "Süd"; Seite 2.nc',
    'back\\slash 100%.tap',
    'тест.gcode',
    '\u{1F4D0} letters.nc',
    "it's (final)*.nc",
  ])('carries %j exactly in filename* and an ASCII stand-in in filename', (name) => {
    const header = programContentDisposition(name);
    expect(header.startsWith('attachment; ')).toBe(true);
    const { fallback, exact } = parse(header);
    expect(exact).toBe(name);
    expect(fallback).toMatch(/^[\x20-\x7e]*$/);
    expect(fallback).not.toMatch(/["\\]/);
    expect([...(fallback ?? '')].length).toBe([...name].length);
    expect(header).not.toMatch(/[\r\n\0]/);
  });
});
