// "Every route handler and server action begins with the guard": read the source of
// each app/api/**/route.ts and each 'use server' file and check that every exported
// handler calls requireAction or requireRole before anything else touches the data.
import { readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';

const ROOT = path.resolve(__dirname, '../../..');

function walk(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const full = path.join(dir, name);
    return statSync(full).isDirectory() ? walk(full) : [full];
  });
}

const appFiles = walk(path.join(ROOT, 'app')).filter((f) => /\.tsx?$/.test(f));
const routeFiles = appFiles.filter((f) => f.endsWith('route.ts') && !f.includes(`${path.sep}api${path.sep}auth${path.sep}`));
const actionFiles = appFiles.filter((f) => /^\s*['"]use server['"]/.test(readFileSync(f, 'utf8')));

/** The body of each exported handler, from its export to the next export. */
function exportedBodies(source: string): { name: string; body: string }[] {
  const re = /export (?:const|async function) (\w+)/g;
  const starts = [...source.matchAll(re)];
  // The body starts after the export's own line, whose name would match the query pattern.
  return starts.map((m, i) => {
    const chunk = source.slice(m.index, starts[i + 1]?.index ?? source.length);
    return { name: m[1], body: chunk.slice(chunk.indexOf('\n')) };
  });
}

describe('guards', () => {
  it('finds the route handlers and server actions', () => {
    expect(routeFiles.length).toBeGreaterThanOrEqual(8);
    expect(actionFiles.length).toBeGreaterThanOrEqual(2);
  });

  for (const file of [...routeFiles, ...actionFiles]) {
    const rel = path.relative(ROOT, file);
    it(`${rel}: every export starts with the guard`, () => {
      const bodies = exportedBodies(readFileSync(file, 'utf8'));
      expect(bodies.length).toBeGreaterThan(0);
      for (const { name, body } of bodies) {
        const guard = body.search(/require(Action|Role)\(/);
        expect(guard, `${name} calls requireAction/requireRole`).toBeGreaterThan(-1);
        const firstQuery = body.search(/\b(list|get|create|update|change|set)[A-Z]\w*\(/);
        if (firstQuery > -1) expect(guard, `${name} guards before its first query`).toBeLessThan(firstQuery);
      }
    });
  }
});
