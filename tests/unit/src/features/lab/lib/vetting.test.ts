import { describe, expect, it } from 'vitest';
import {
  decimalsForError,
  formatDiagnosticValue,
  formatMeasurement,
  formatPercent,
  hasError,
  oneIn,
  warningCount,
} from '@/features/lab/lib/vetting';

describe('formatMeasurement', () => {
  it('rounds the value to two significant figures of its error (vetting-209: 3.7497 ± 0.01915 R⊕)', () => {
    expect(formatMeasurement(3.7496906610933802, 0.019151584313011068, 'R⊕')).toBe('3.750 ± 0.019 R⊕');
    expect(formatMeasurement(5411.999750816209, 55.283690788257424, 'ppm')).toBe('5412 ± 55 ppm');
    expect(formatMeasurement(0.07356629493739784, 0.00037574062167533215)).toBe('0.07357 ± 0.00038');
  });

  it('gives the value alone when no error was measured, and a dash for no value', () => {
    expect(formatMeasurement(19.089947227086192, 0, 'R⊕', 1)).toBe('19.1 R⊕');
    expect(formatMeasurement(2.5, null)).toBe('2.50');
    expect(formatMeasurement(null, 1)).toBe('—');
    expect(formatMeasurement(-94.5, 56.6, 'ppm')).toBe('−95 ± 57 ppm');
  });
});

describe('decimalsForError and hasError', () => {
  it('counts decimals for two figures, and none for a zero error', () => {
    expect(decimalsForError(0.019)).toBe(3);
    expect(decimalsForError(55)).toBe(0);
    expect(decimalsForError(1234)).toBe(0);
    expect(decimalsForError(0)).toBeNull();
    expect(hasError(0)).toBe(false);
    expect(hasError(0.2)).toBe(true);
  });
});

describe('probabilities', () => {
  it('reads the transit probability as a percentage and as one in n (vetting-209: 0.0959 → 1 in 10)', () => {
    expect(formatPercent(0.09585354436436354)).toBe('9.59 %');
    expect(oneIn(0.09585354436436354)).toBe('about 1 in 10');
    expect(oneIn(0)).toBe('—');
  });
});

describe('diagnostics', () => {
  it('writes values with a true minus and counts warnings', () => {
    expect(formatDiagnosticValue(-1.7)).toBe('−1.7');
    expect(formatDiagnosticValue(null)).toBe('—');
    expect(warningCount([{ verdict: 'pass' }, { verdict: 'warn' }, { verdict: 'warn' }])).toBe(2);
  });
});
