// The estimate CLI's contract for the program file itself: an empty, blank or binary file (a
// NUL byte, or bytes that are not UTF-8) exits 2 with one line on stderr, as an unreadable file
// does, and nothing on stdout; a program with CR-only line ends (NISTIR 6556 §3.3: a line ends
// at CR, LF or both) is estimated exactly as the same program with LF ends.
import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';

const root = path.resolve(__dirname, '../../..');
const machine = path.join(root, 'fixtures/machines/router-1.json');
const dir = mkdtempSync(path.join(os.tmpdir(), 'kerfcast-cli-input-'));

function write(name: string, content: string | Uint8Array): string {
  const file = path.join(dir, name);
  mkdirSync(path.dirname(file), { recursive: true });
  writeFileSync(file, content);
  return file;
}

function cli(file: string, ...extra: string[]) {
  return spawnSync('node', ['--require', 'tsx/cjs', 'scripts/estimate.ts', file, '--machine', machine, ...extra], { cwd: root, encoding: 'utf8' });
}

function expectRefused(file: string, message: RegExp): void {
  const r = cli(file, '--json');
  expect(r.status).toBe(2);
  expect(r.stdout).toBe('');
  const lines = r.stderr.trimEnd().split('\n');
  expect(lines).toHaveLength(1);
  expect(lines[0]).toContain(file);
  expect(lines[0]).toMatch(message);
}

// a small plate profile in 18 mm birch ply (Alder & Finch demo job)
const PROGRAM = ['(plate, 18 mm birch ply)', 'G21 G90 G17', 'T1 M6', 'S18000 M3', 'G0 X10 Y10 Z5', 'G1 Z-3 F900', 'G1 X110 F4800', 'G1 Y70', 'G1 X10', 'G1 Y10', 'G0 Z5', 'M5', 'M30'];

describe('estimate CLI: program files that are no program', () => {
  it('an empty file exits 2 with one line', () => {
    expectRefused(write('empty.nc', ''), /The file is empty\./);
  });

  it('a file of blank lines exits 2 with one line', () => {
    expectRefused(write('blank.nc', '\r\n  \n\t\n'), /only blank lines/);
  });

  it('a binary file (a NUL byte) exits 2 naming the byte and its line', () => {
    // the first bytes of a zip archive: "PK", 03 04, 14 00 …
    expectRefused(write('archive.nc', new Uint8Array([0x50, 0x4b, 0x03, 0x04, 0x14, 0x00, 0x00, 0x00])), /byte 6, on line 1, is a NUL byte/);
  });

  it('a file that is not UTF-8 (a Latin-1 é in a comment on line 2) exits 2 naming the byte and its line', () => {
    const head = Buffer.from('G21\n(', 'latin1');
    expectRefused(write('latin1.nc', Buffer.concat([head, Buffer.from('é)\nM30\n', 'latin1')])), new RegExp(`byte ${head.length + 1}, on line 2, is not valid UTF-8`));
  });
});

describe('estimate CLI: line ends (NISTIR 6556 §3.3)', () => {
  it('CR-only and CRLF programs give the same report as the LF program (apart from the file hash)', () => {
    const report = (eol: string) => {
      const r = cli(write(`${eol === '\n' ? 'lf' : eol === '\r' ? 'cr' : 'crlf'}/plate.nc`, PROGRAM.join(eol) + eol), '--json');
      expect(r.stderr).toBe('');
      expect(r.status).toBe(0);
      const out = JSON.parse(r.stdout);
      expect(out.file.sha256).toMatch(/^[0-9a-f]{64}$/);
      delete out.file.sha256;
      return out;
    };
    const lf = report('\n');
    expect(lf.totalSeconds).toBeGreaterThan(0);
    expect(report('\r')).toEqual(lf);
    expect(report('\r\n')).toEqual(lf);
  });
});
