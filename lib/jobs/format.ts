// How the jobs pages write figures: lengths without trailing zeros, times of day in UTC (the
// shop has no time zone setting yet, so the page says which clock it uses), durations in h min s.
export const formatMm = (v: number) => (Number.isInteger(v) ? String(v) : String(Math.round(v * 100) / 100));

export function formatWhen(at: Date | string): string {
  const d = typeof at === 'string' ? new Date(at) : at;
  const pad = (n: number) => String(n).padStart(2, '0');
  return `${d.getUTCFullYear()}-${pad(d.getUTCMonth() + 1)}-${pad(d.getUTCDate())} ${pad(d.getUTCHours())}:${pad(d.getUTCMinutes())} UTC`;
}

/** 5025.4 s → "1 h 23 min 45 s"; under a minute with one decimal. */
export function formatDuration(seconds: number): string {
  if (!Number.isFinite(seconds) || seconds < 0) return '—';
  if (seconds < 60) return `${(Math.round(seconds * 10) / 10).toFixed(1)} s`;
  const total = Math.round(seconds);
  const h = Math.floor(total / 3600);
  const m = Math.floor((total % 3600) / 60);
  const s = total % 60;
  return [h ? `${h} h` : '', h || m ? `${m} min` : '', `${s} s`].filter(Boolean).join(' ');
}

/** 1536 → "1.5 KiB" (IEC 80000-13 binary prefixes). */
export function formatBytes(bytes: number): string {
  if (bytes < 1024) return `${bytes} B`;
  const units = ['KiB', 'MiB', 'GiB'];
  let v = bytes / 1024;
  let i = 0;
  while (v >= 1024 && i < units.length - 1) {
    v /= 1024;
    i++;
  }
  return `${v < 100 ? v.toFixed(1) : Math.round(v)} ${units[i]}`;
}
