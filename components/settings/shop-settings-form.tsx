'use client';
// The shop settings form: every column of shop_settings, saved whole with PUT
// /api/shop/settings. Shares are typed in percent (stored as basis points, 1 % = 100 bp),
// money in major units of the shop's currency (stored as minor units), times in seconds.
// Each field names the default it started with and whether that is common practice.
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { FieldShell, InputField, SelectField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import type { ShopSettings } from '@/db/schema';
import { AppError, type FieldErrors } from '@/lib/errors';
import { fetcher } from '@/lib/fetcher';
import { minorToInput, parseMajorToMinor } from '@/lib/units/money';

type Key = Exclude<keyof ShopSettings, 'shopId' | 'updatedAt'>;
type Kind = 'text' | 'int' | 'seconds' | 'percent' | 'money' | 'rounding';

interface FieldDef {
  key: Key;
  label: string;
  kind: Kind;
  hint: string;
}

// "common practice" marks figures usual in small router shops, from memory, not measured;
// the shop sets its own (docs/references.md).
const GROUPS: { title: string; fields: FieldDef[] }[] = [
  {
    title: 'On the quote',
    fields: [
      { key: 'address', label: 'Shop address', kind: 'text', hint: 'Printed under the shop name on quotes; several lines.' },
      { key: 'quoteTerms', label: 'Quote terms', kind: 'text', hint: 'Printed on the quote and shown on the customer’s page.' },
      { key: 'quoteValidityDays', label: 'Validity (days)', kind: 'int', hint: 'Default 30 days (common practice).' },
    ],
  },
  {
    title: 'Machine time',
    fields: [
      { key: 'setupS', label: 'Setup per job (s)', kind: 'seconds', hint: 'Loading the program, zeroing, first-sheet checks. Default 900 s (common practice).' },
      { key: 'loadUnloadSPerSheet', label: 'Load and unload per sheet (s)', kind: 'seconds', hint: 'Sheet on, cut parts off. Default 240 s (common practice).' },
    ],
  },
  {
    title: 'Price',
    fields: [
      { key: 'wasteAllowanceBp', label: 'Material waste allowance (%)', kind: 'percent', hint: 'Added to the sheets’ cost. Default 10 % (common practice).' },
      { key: 'marginBp', label: 'Margin (%)', kind: 'percent', hint: 'On the subtotal. Default 25 %: a starting figure, set your own.' },
      { key: 'taxBp', label: 'Tax (%)', kind: 'percent', hint: 'On the rounded net. Default 0 %: set your local rate.' },
      { key: 'roundToMinor', label: 'Round the net to a multiple of', kind: 'money', hint: 'In your currency; 0.01 means no rounding. Default 1.00.' },
      { key: 'roundingMode', label: 'Rounding', kind: 'rounding', hint: 'Nearest rounds half up. Default nearest.' },
      { key: 'labourRateMinorPerHour', label: 'Labour rate per hour', kind: 'money', hint: 'Hand work after cutting. Default 40.00.' },
    ],
  },
  {
    title: 'Hold-down labour and consumables',
    fields: [
      { key: 'tapeGlueSPerPart', label: 'Tape and glue, per part (s)', kind: 'seconds', hint: 'Taping, gluing, peeling and cleaning one part. Default 40 s (common practice).' },
      { key: 'tabSPerTab', label: 'Tabs, per tab (s)', kind: 'seconds', hint: 'Cutting one tab free and sanding it flush. Default 12 s (common practice).' },
      { key: 'skinSPerPart', label: 'Onion skin, per part (s)', kind: 'seconds', hint: 'Breaking one part out and cleaning its edge. Default 20 s (common practice).' },
      { key: 'clampsSPerSheet', label: 'Screws or clamps, per sheet (s)', kind: 'seconds', hint: 'Fixing and freeing one sheet. Default 120 s (common practice).' },
      { key: 'tapeCostMinorPerM2', label: 'Tape cost per m² of parts', kind: 'money', hint: 'Default 3.00 (common practice).' },
      { key: 'glueCostMinorPerPart', label: 'Glue cost per part', kind: 'money', hint: 'Default 0.05 (common practice).' },
    ],
  },
  {
    title: 'Calibration',
    fields: [
      { key: 'calibrationRuns', label: 'Runs used (N latest)', kind: 'int', hint: 'How many of a machine’s latest uninterrupted runs the suggestion uses. Default 20.' },
      { key: 'calibrationMinRuns', label: 'Minimum runs', kind: 'int', hint: 'Fewer runs than this: no suggestion. Default 5.' },
    ],
  },
];

function toText(kind: Kind, value: unknown, currency: string): string {
  if (kind === 'money') return minorToInput(Number(value), currency);
  if (kind === 'percent') {
    const bp = Number(value);
    return bp % 100 === 0 ? String(bp / 100) : `${Math.trunc(bp / 100)}.${String(bp % 100).padStart(2, '0')}`;
  }
  return String(value ?? '');
}

/** "12.5" % → 1250 bp, by string digits, never a float product. */
function percentToBp(text: string): number | null {
  const m = /^(\d+)(?:\.(\d{1,2}))?$/.exec(text.trim());
  return m ? Number(m[1]) * 100 + Number((m[2] ?? '').padEnd(2, '0')) : null;
}

export function ShopSettingsForm({ initial, currency }: { initial: ShopSettings; currency: string }) {
  const all = GROUPS.flatMap((g) => g.fields);
  const [values, setValues] = useState<Record<string, string>>(() => Object.fromEntries(all.map((f) => [f.key, toText(f.kind, initial[f.key], currency)])));
  const [fields, setFields] = useState<FieldErrors>({});
  const [state, setState] = useState<{ tone: 'ok' | 'fault'; text: string } | null>(null);
  const [busy, setBusy] = useState(false);

  async function save(e: React.FormEvent) {
    e.preventDefault();
    const body: Record<string, unknown> = {};
    const errs: FieldErrors = {};
    for (const f of all) {
      const t = values[f.key] ?? '';
      if (f.kind === 'money') {
        const m = parseMajorToMinor(t, currency);
        if (m.ok) body[f.key] = m.minor;
        else errs[f.key] = [m.message];
      } else if (f.kind === 'percent') {
        const bp = percentToBp(t);
        if (bp === null) errs[f.key] = ['Enter a percentage such as 12.5 (at most 2 decimals).'];
        else body[f.key] = bp;
      } else if (f.kind === 'text' || f.kind === 'rounding') body[f.key] = t;
      else body[f.key] = t.trim() === '' ? undefined : t.trim();
    }
    if (Object.keys(errs).length > 0) {
      setFields(errs);
      setState({ tone: 'fault', text: 'Some settings need fixing: each one is named at its field.' });
      return;
    }
    setBusy(true);
    try {
      await fetcher('/api/shop/settings', { method: 'PUT', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });
      setFields({});
      setState({ tone: 'ok', text: 'Settings saved. New quotes use them; quotes already made keep the figures they were made with.' });
    } catch (err) {
      const ae = err instanceof AppError ? err : new AppError('internal', String(err));
      setFields(ae.fields ?? {});
      setState({ tone: 'fault', text: ae.message });
    } finally {
      setBusy(false);
    }
  }

  const set = (key: string, v: string) => setValues((old) => ({ ...old, [key]: v }));

  return (
    <form onSubmit={save} className="flex flex-col gap-6" aria-label="Shop settings" noValidate>
      {GROUPS.map((g) => (
        <fieldset key={g.title} className="rounded-md border-2 border-rule bg-panel p-5">
          <legend className="px-1 text-lg font-bold">{g.title}</legend>
          <div className="grid gap-4 md:grid-cols-2">
            {g.fields.map((f) => {
              const id = `settings-${f.key}`;
              if (f.key === 'address' || f.key === 'quoteTerms') {
                return (
                  <FieldShell key={f.key} id={id} label={f.label} hint={f.hint} errors={fields[f.key]}>
                    <textarea
                      id={id}
                      name={f.key}
                      rows={4}
                      aria-describedby={`${id}-hint${fields[f.key]?.length ? ` ${id}-error` : ''}`}
                      aria-invalid={fields[f.key]?.length ? true : undefined}
                      className="rounded-md border-2 border-rule bg-panel p-3 text-base"
                      value={values[f.key]}
                      onChange={(e) => set(f.key, e.target.value)}
                    />
                  </FieldShell>
                );
              }
              if (f.kind === 'rounding') {
                return (
                  <SelectField
                    key={f.key}
                    id={id}
                    name={f.key}
                    label={f.label}
                    hint={f.hint}
                    errors={fields[f.key]}
                    value={values[f.key]}
                    onChange={(e) => set(f.key, e.target.value)}
                    options={[
                      { value: 'nearest', label: 'To the nearest multiple (half up)' },
                      { value: 'up', label: 'Always up' },
                    ]}
                  />
                );
              }
              return (
                <InputField
                  key={f.key}
                  id={id}
                  name={f.key}
                  label={f.kind === 'money' ? `${f.label} (${currency})` : f.label}
                  hint={f.hint}
                  inputMode={f.kind === 'int' ? 'numeric' : 'decimal'}
                  errors={fields[f.key]}
                  value={values[f.key]}
                  onChange={(e) => set(f.key, e.target.value)}
                />
              );
            })}
          </div>
        </fieldset>
      ))}
      {state ? <Notice tone={state.tone} title={state.text} role={state.tone === 'fault' ? 'alert' : 'status'} /> : null}
      <div>
        <Button type="submit" disabled={busy}>{busy ? 'Saving…' : 'Save settings'}</Button>
      </div>
    </form>
  );
}
