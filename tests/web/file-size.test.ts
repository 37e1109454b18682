// The viewer's file sizes: a small file reads in kB, not "0.0 MB" (sizes in SI units, 1 kB = 1000 bytes).
import { describe, expect, it } from 'vitest';
import { formatFileSize } from '../../web/dom';

describe('viewer file sizes', () => {
  it('kB below 1 MB, MB with one decimal from there; bytes below 1 kB', () => {
    expect(formatFileSize(512)).toBe('512 bytes');
    expect(formatFileSize(30_500)).toBe('31 kB');
    expect(formatFileSize(999_400)).toBe('999 kB');
    expect(formatFileSize(1_250_000)).toBe('1.3 MB');
    expect(formatFileSize(198_600_000)).toBe('198.6 MB');
  });
});
