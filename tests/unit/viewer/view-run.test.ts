// The browser worker's job run in Node: its report for the demo fixture is the CLI's report for
// the same file, profile and settings (the same engine, so the same JSON; the program page says
// so), its SHA-256 is the file's (node:crypto as the independent reference), progress climbs to
// 100, and every per-move array can be transferred (structuredClone with a transfer list
// detaches each buffer instead of copying it).
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { runEstimate } from '@/lib/estimate/run-estimate';
import { parseMachineProfile } from '@/lib/validation/machine-profile';
import { forTransfer, fromTransfer, openProgram, resultTransferables, TRANSFER_CHUNK } from '@/lib/viewer/view-run';

const bytes = new Uint8Array(readFileSync('fixtures/programs/shelf-brackets-birch-18mm.nc'));
const parsed = parseMachineProfile(JSON.parse(readFileSync('fixtures/machines/router-1.json', 'utf8')));
if (!parsed.ok) throw new Error(parsed.message);
const profile = parsed.profile;
const job = { sheet: { widthMm: 1220, lengthMm: 2440, thicknessMm: 18 }, zero: 'top' as const, hold: 'vacuum' as const, vacuumKpa: 60 };

describe('openProgram (the viewer worker’s job)', () => {
  it('gives the CLI’s report, the file’s SHA-256 and progress up to 100', async () => {
    const seen: number[] = [];
    const r = await openProgram(bytes, { name: 'shelf-brackets-birch-18mm.nc', profile, job }, (p) => seen.push(p.percent));
    const sha = createHash('sha256').update(bytes).digest('hex');
    expect(r.sha256).toBe(sha);
    const cli = runEstimate(new TextDecoder().decode(bytes), profile, job, { name: 'shelf-brackets-birch-18mm.nc', sha256: sha });
    expect(JSON.stringify(r.report)).toBe(JSON.stringify(cli.report));
    expect(seen.at(-1)).toBe(100);
    for (let i = 1; i < seen.length; i++) expect(seen[i]).toBeGreaterThanOrEqual(seen[i - 1]);
    expect(r.lineStarts.length - 1).toBe(r.report.file.lines);
    expect(r.path.moveSegStart.length).toBe(r.moves.count + 1);
  });
  it('every typed array goes across transferred: the sender’s buffers are detached', async () => {
    const r = await openProgram(bytes, { name: 'f.nc', profile, job }, () => {});
    const list = resultTransferables(r);
    const copy = structuredClone(r, { transfer: list });
    expect(r.moves.x.byteLength).toBe(0);
    expect(r.path.positions.byteLength).toBe(0);
    expect(r.cumulativeS.byteLength).toBe(0);
    expect(copy.path.positions.length).toBeGreaterThan(0);
    expect(copy.moves.count).toBe(copy.moves.x.length);
  });
  it('the plunge points cross as columns, parts and findings in chunks, and the page reads the CLI’s report from them, byte for byte', async () => {
    const r = await openProgram(bytes, { name: 'shelf-brackets-birch-18mm.nc', profile, job }, () => {});
    const { result: sent, chunks } = forTransfer(r);
    expect((sent.report.checks as { plungePoints: unknown }).plungePoints).toBeNull();
    // the parts and findings go ahead in chunks of TRANSFER_CHUNK, each its own message
    expect(sent.report.parts).toEqual([]);
    expect(chunks.filter((c) => c.key === 'parts').reduce((n, c) => n + c.items.length, 0)).toBe(r.report.parts.length);
    for (const c of chunks) expect(c.items.length).toBeLessThanOrEqual(TRANSFER_CHUNK);
    const arrived = fromTransfer(structuredClone(sent, { transfer: resultTransferables(sent) }), chunks.map((c) => structuredClone(c)));
    expect(r.plunges.x.byteLength).toBe(0);
    const cli = runEstimate(new TextDecoder().decode(bytes), profile, job, { name: 'shelf-brackets-birch-18mm.nc', sha256: r.sha256 });
    const cliPlunges = (cli.report.checks as { plungePoints: unknown[] }).plungePoints;
    expect(cliPlunges.length).toBeGreaterThan(10);
    expect(arrived.plunges.count).toBe(cliPlunges.length);
    expect(JSON.stringify(arrived.report)).toBe(JSON.stringify(cli.report));
  });
  it('refuses a file that is not program text, naming why', async () => {
    await expect(openProgram(Uint8Array.of(0x47, 0x30, 0x00, 0x0a), { name: 'bad.nc', profile, job }, () => {})).rejects.toThrow(/cannot be shown/);
  });
});
