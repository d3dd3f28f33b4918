// A progress bar: the native <progress> element (its role and value are read out by screen
// readers without extra ARIA), filled in the `note` tone on a ruled track (not the action
// colour: a bar is not something to press), always with the
// figure in words beside it so the bar is never the only signal. No inline style: the
// Content-Security-Policy allows no style attributes.
export function ProgressBar({ value, max = 1, label, text }: { value: number | null; max?: number; label: string; text: string }) {
  return (
    <div className="flex items-center gap-3">
      <progress
        aria-label={label}
        max={max}
        // null: how far is not known yet (an indeterminate bar)
        {...(value === null ? {} : { value: Math.min(max, Math.max(0, value)) })}
        className="h-4 w-full min-w-32 flex-1 overflow-hidden rounded-full border-2 border-rule bg-ground [&::-moz-progress-bar]:bg-note [&::-webkit-progress-bar]:bg-ground [&::-webkit-progress-value]:bg-note"
      />
      <span className="figure shrink-0 text-sm text-ink-soft">{text}</span>
    </div>
  );
}
