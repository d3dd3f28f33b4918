// The viewer's figures: the playback clock as m:ss or h:mm:ss, and coordinates in mm or inch
// (inch is 25.4 mm exactly: NIST SP 811, appendix B.8), with a fixed number of decimals so the
// readout does not jump about while the tool moves.
import { fromMm, type LengthUnit } from '@/lib/units/length';

/** 75.4 → "1:15"; 3725 → "1:02:05"; negative or not finite → "0:00" */
export function formatClock(seconds: number): string {
  const total = Number.isFinite(seconds) && seconds > 0 ? Math.floor(seconds) : 0;
  const h = Math.floor(total / 3600);
  const m = Math.floor((total % 3600) / 60);
  const s = total % 60;
  const ss = String(s).padStart(2, '0');
  return h > 0 ? `${h}:${String(m).padStart(2, '0')}:${ss}` : `${m}:${ss}`;
}

/** a coordinate for the readout: 3 decimals in mm, 4 in inches */
export function formatCoordinate(valueMm: number, unit: LengthUnit): string {
  const v = fromMm(valueMm, unit);
  const text = v.toFixed(unit === 'mm' ? 3 : 4);
  return text === '-0.000' || text === '-0.0000' ? text.slice(1) : text;
}

/** a size for tables: one decimal in mm, three in inches, with the unit */
export function formatSize(valueMm: number, unit: LengthUnit): string {
  const v = fromMm(valueMm, unit);
  return unit === 'mm' ? `${v.toFixed(1)} mm` : `${v.toFixed(3)} in`;
}

/** an area for tables: mm² or in² (645.16 mm² per in²) */
export function formatArea(areaMm2: number, unit: LengthUnit): string {
  if (unit === 'mm') return `${Math.round(areaMm2).toLocaleString('en')} mm²`;
  return `${(areaMm2 / 645.16).toFixed(2)} in²`;
}
