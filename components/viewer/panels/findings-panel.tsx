'use client';
// Every finding of the program (severity in a word and a shape, kind, line, message); choosing
// one moves the playhead to its line and the camera to it. The caution that the checks are an
// aid, not a guarantee, stays beside the list.
import type { ReportFinding } from '@/lib/kinematics/estimate-report';

const SEVERITY = {
  error: { glyph: '✕', word: 'Error', tone: 'border-fault bg-fault-tint text-fault' },
  warning: { glyph: '!', word: 'Warning', tone: 'border-caution bg-caution-tint text-caution' },
  info: { glyph: 'i', word: 'Note', tone: 'border-note bg-note-tint text-note' },
} as const;

export function FindingsPanel({ findings, note, onChoose }: { findings: ReportFinding[]; note: string; onChoose: (f: ReportFinding) => void }) {
  return (
    <section aria-labelledby="findings-title" className="flex min-h-0 flex-col rounded-md border-2 border-rule bg-panel">
      <h3 id="findings-title" className="border-b-2 border-rule-light px-3 py-2 text-base font-bold">
        Findings <span className="figure font-normal text-ink-soft">({findings.length})</span>
      </h3>
      <p className="border-b-2 border-rule-light bg-caution-tint px-3 py-2 text-sm text-ink" data-testid="viewer-caution">
        <span aria-hidden="true" className="mr-1 font-bold text-caution">
          !
        </span>
        {note}
      </p>
      {findings.length === 0 ? (
        <p className="px-3 py-2">No findings in this program.</p>
      ) : (
        <ul aria-label="Findings" className="max-h-80 overflow-auto" data-testid="viewer-findings">
          {findings.map((f, i) => {
            const s = SEVERITY[f.severity] ?? SEVERITY.info;
            return (
              <li key={`${f.line}-${f.kind}-${i}`} className="border-t border-rule-light first:border-t-0" data-line={f.line} data-kind={f.kind}>
                <button type="button" onClick={() => onChoose(f)} className="flex w-full gap-2 px-3 py-2 text-left hover:bg-ground focus-visible:outline-3">
                  <span className={`inline-flex h-7 shrink-0 items-center gap-1 rounded-full border-2 px-2 text-sm font-bold ${s.tone}`}>
                    <span aria-hidden="true">{s.glyph}</span>
                    {s.word}
                  </span>
                  <span>
                    <span className="figure font-bold">{f.line > 0 ? `Line ${f.line}` : 'Whole program'}</span>
                    <span className="text-ink-soft"> · {f.kind}</span>
                    {f.part ? <span className="text-ink-soft"> · part {f.part}</span> : null}
                    <span className="block text-sm">{f.message}</span>
                  </span>
                </button>
              </li>
            );
          })}
        </ul>
      )}
    </section>
  );
}
