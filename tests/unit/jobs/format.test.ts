// Figures on the jobs pages: 1 h = 3600 s and 1 min = 60 s (SI Brochure, 9th ed., Table 8);
// KiB = 1024 B and MiB = 1024² B (IEC 80000-13:2008, binary prefixes).
import { describe, expect, it } from 'vitest';
import { formatBytes, formatDuration, formatMm, formatWhen } from '@/lib/jobs/format';

describe('formatDuration', () => {
  it('splits hours, minutes and seconds', () => {
    expect(formatDuration(3600 + 23 * 60 + 45)).toBe('1 h 23 min 45 s');
    expect(formatDuration(3600)).toBe('1 h 0 min 0 s');
    expect(formatDuration(125)).toBe('2 min 5 s');
    expect(formatDuration(42.26)).toBe('42.3 s');
    expect(formatDuration(-1)).toBe('—');
  });
});

describe('formatBytes', () => {
  it('uses binary prefixes', () => {
    expect(formatBytes(900)).toBe('900 B');
    expect(formatBytes(1536)).toBe('1.5 KiB');
    expect(formatBytes(15562)).toBe('15.2 KiB');
    expect(formatBytes(100 * 1024 * 1024)).toBe('100 MiB');
  });
});

describe('formatMm and formatWhen', () => {
  it('drops trailing zeros and writes the UTC clock', () => {
    expect(formatMm(18)).toBe('18');
    expect(formatMm(3.175)).toBe('3.18');
    expect(formatWhen('2026-12-04T01:05:09Z')).toBe('2026-12-04 01:05 UTC');
  });
});
