'use client';
// A button that asks before it acts: the first press shows what will happen and two
// buttons, "Yes, …" and "Keep it"; focus moves to the question so a keyboard user hears it.
// The outcome of the server action shows below.
import { useActionState, useEffect, useRef, useState } from 'react';
import { Button } from '@/components/ui/button';
import { ActionNotice } from '@/components/ui/notice';
import { IDLE, type ActionState } from '@/lib/http/action-state';

interface Props {
  action: (state: ActionState, form: FormData) => Promise<ActionState>;
  hidden: Record<string, string | number>;
  label: string;
  question: string;
  confirmLabel: string;
  variant?: 'danger' | 'secondary';
}

export function ConfirmAction({ action, hidden, label, question, confirmLabel, variant = 'danger' }: Props) {
  const [state, dispatch, pending] = useActionState(action, IDLE);
  // the answer the question was asked after: a newer answer closes the question
  const [askedAfter, setAskedAfter] = useState<number | null>(null);
  const asking = askedAfter !== null && askedAfter === (state.at ?? 0);
  const setAsking = (on: boolean) => setAskedAfter(on ? (state.at ?? 0) : null);
  const questionRef = useRef<HTMLParagraphElement>(null);
  useEffect(() => {
    if (asking) questionRef.current?.focus();
  }, [asking]);
  return (
    <div className="flex flex-col gap-2">
      {asking ? (
        <form action={dispatch} className="flex flex-col gap-2 rounded-md border-2 border-fault bg-panel p-3">
          {Object.entries(hidden).map(([k, v]) => (
            <input key={k} type="hidden" name={k} value={v} />
          ))}
          <p ref={questionRef} tabIndex={-1} className="font-bold">
            {question}
          </p>
          <div className="flex flex-wrap gap-2">
            <Button type="submit" variant={variant} disabled={pending}>
              {pending ? 'Working…' : confirmLabel}
            </Button>
            <Button type="button" variant="secondary" onClick={() => setAsking(false)}>
              Keep it
            </Button>
          </div>
        </form>
      ) : (
        <div>
          <Button type="button" variant={variant} onClick={() => setAsking(true)}>
            {label}
          </Button>
        </div>
      )}
      <ActionNotice state={state} />
    </div>
  );
}
