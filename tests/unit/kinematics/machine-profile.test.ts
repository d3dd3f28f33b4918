// The machine profile schema (issue's JSON form): the shipped demo machines validate, and a bad
// profile is rejected with a message naming the field.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseMachineProfile } from '@/lib/validation/machine-profile';

interface Raw {
  accel: Record<string, unknown>;
  maxFeed: Record<string, unknown>;
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
    const t1 = fixture('router-1.json').travel as { x: number; y: number };
    const t2 = fixture('router-2.json').travel as { x: number; y: number };
    expect([t1.x, t1.y].sort()).toEqual([1530, 3060].sort());
    expect([t2.x, t2.y].sort()).toEqual([1250, 2500].sort());
  });

  it.each([
    [(p: Raw) => { p.accel.y = 0; }, 'accel.y: must be greater than 0'],
    [(p: Raw) => { delete p.maxFeed.z; }, 'maxFeed.z: is required'],
    [(p: Raw) => { p.lookahead = 2.5; }, 'lookahead: must be a whole number'],
    [(p: Raw) => { p.lookahead = -1; }, 'lookahead: must be 0 (unlimited) or more'],
    [(p: Raw) => { p.junctionDeviation = 'small'; }, 'junctionDeviation: must be a number'],
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

  it('accepts lookahead 0 and maxBlockRate 0 (unlimited) and an empty tool list', () => {
    const p = { ...fixture('router-2.json'), lookahead: 0, maxBlockRate: 0, tools: [] };
    expect(parseMachineProfile(p).ok).toBe(true);
  });

  it('rejects something that is not an object at all', () => {
    const r = parseMachineProfile(42);
    expect(r.ok).toBe(false);
  });
});
