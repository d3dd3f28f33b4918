// The machine profile schema (issue's JSON form): the shipped demo machines validate, and a bad
// profile is rejected with a message naming the field.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseMachineProfile } from '@/lib/validation/machine-profile';

interface Raw {
  accelMmPerS2: Record<string, unknown>;
  maxFeedMmPerMin: Record<string, unknown>;
  tools: Record<string, unknown>[];
  [field: string]: unknown;
}

const fixture = (name: string): Raw => JSON.parse(readFileSync(path.join(__dirname, '../../../fixtures/machines', name), 'utf8'));

describe('machine profile', () => {
  it.each(['router-1.json', 'router-2.json'])('%s is a valid profile', (name) => {
    const r = parseMachineProfile(fixture(name));
    expect(r.ok ? r.profile.name : r.message).toMatch(/^Router [12]$/);
  });

  it('the demo machines’ tables: Router 1 1530 × 3060 mm, Router 2 1250 × 2500 mm (CONVENTIONS.md)', () => {
    const t1 = fixture('router-1.json').travelMm as { x: number; y: number };
    const t2 = fixture('router-2.json').travelMm as { x: number; y: number };
    expect([t1.x, t1.y].sort()).toEqual([1530, 3060].sort());
    expect([t2.x, t2.y].sort()).toEqual([1250, 2500].sort());
  });

  it.each([
    [(p: Raw) => { p.accelMmPerS2.y = 0; }, 'accelMmPerS2.y: must be greater than 0'],
    [(p: Raw) => { delete p.maxFeedMmPerMin.z; }, 'maxFeedMmPerMin.z: is required'],
    [(p: Raw) => { p.lookaheadBlocks = 2.5; }, 'lookaheadBlocks: must be a whole number'],
    [(p: Raw) => { p.lookaheadBlocks = -1; }, 'lookaheadBlocks: must be 0 (unlimited) or more'],
    [(p: Raw) => { p.cornerToleranceMm = 'small'; }, 'cornerToleranceMm: must be a number'],
    [(p: Raw) => { p.chordToleranceMm = 0; }, 'chordToleranceMm: must be greater than 0'],
    [(p: Raw) => { p.tools[0].diameterMm = -3; }, 'tools[0].diameterMm: must be greater than 0'],
    [(p: Raw) => { p.tools[1].kind = 'spiral'; }, 'tools[1].kind: must be one of upcut, downcut, compression, straight, v, ball'],
    [(p: Raw) => { p.tools[1].number = p.tools[0].number; }, 'tools[1].number: tool 1 is listed twice'],
    [(p: Raw) => { p.timeFactor = 0; }, 'timeFactor: must be greater than 0'],
    [(p: Raw) => { p.name = '  '; }, 'name: must not be empty'],
  ])('rejects a bad field with its name (%#)', (spoil, message) => {
    const p = fixture('router-1.json');
    spoil(p);
    const r = parseMachineProfile(p);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toBe(message);
  });

  it('accepts lookaheadBlocks 0 and maxBlocksPerS 0 (unlimited) and an empty tool list', () => {
    const p = { ...fixture('router-2.json'), lookaheadBlocks: 0, maxBlocksPerS: 0, tools: [] };
    expect(parseMachineProfile(p).ok).toBe(true);
  });

  it('a profile must use the names with units: one without travelMm is refused naming it', () => {
    const { travelMm, ...rest } = fixture('router-1.json');
    const r = parseMachineProfile({ ...rest, travel: travelMm });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toMatch(/^travelMm: is required/);
  });

  it('rejects something that is not an object at all', () => {
    const r = parseMachineProfile(42);
    expect(r.ok).toBe(false);
  });
});
