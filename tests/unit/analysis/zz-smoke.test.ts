import { test } from 'vitest';
import { analyze } from '@/lib/analysis';
import { ProgramWriter } from '@/tests/unit/analysis/support/program';
test('smoke', () => {
  const w = new ProgramWriter();
  w.circle(50, 50, 10, [-6, -12, -18.2]);
  w.rect(20, 20, 80, 80, [-6, -12, -18.2]);
  w.rect(120, 20, 180, 80, [-6, -12, -18.2], { tabs: { perSide: 1, lengthMm: 8, heightMm: 3 } });
  w.rect(220, 20, 250, 50, [-6, -12, -17.7]);
  w.rapid(10, 10, -2);
  const r = analyze(w.build(), { sheet: { widthMm: 1220, lengthMm: 2440, thicknessMm: 18 }, zZero: 'top', holdDown: 'vacuum', tools: [{ number: 1, diameter: 6, flutes: 2, kind: 'compression' }] });
  console.log(JSON.stringify(r, (k, v) => (k === 'settings' ? undefined : v), 1));
});
