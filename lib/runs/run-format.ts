// How the run forms read and write times: the timer's face (h:mm:ss) and a typed duration
// (minutes, or h:mm / h:mm:ss). Pure, shared by the timer and the forms.

/** 3725 s → "1:02:05" (h:mm:ss), the clock face of a run; negative times show as 0:00:00. */
export function clockFace(seconds: number): string {
  const total = Math.max(0, Math.floor(seconds));
  const h = Math.floor(total / 3600);
  const m = Math.floor((total % 3600) / 60);
  const s = total % 60;
  return `${h}:${String(m).padStart(2, '0')}:${String(s).padStart(2, '0')}`;
}

/** "45" or "45.5" minutes, "1:05" (h:mm) or "1:05:30" (h:mm:ss) → seconds; null when it is none of these. */
export function parseDurationText(text: string): number | null {
  const t = text.trim();
  if (/^\d+(\.\d+)?$/.test(t)) return Math.round(Number(t) * 60);
  const m = /^(\d+):([0-5]\d)(?::([0-5]\d))?$/.exec(t);
  if (!m) return null;
  return Number(m[1]) * 3600 + Number(m[2]) * 60 + (m[3] === undefined ? 0 : Number(m[3]));
}
