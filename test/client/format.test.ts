import { describe, it, expect } from 'vitest';
import { formatDuration, formatMetres, formatNumber, formatP, formatPercent } from '../../shared/format.js';

describe('format helpers', () => {
  it('formatNumber keeps significant digits and drops trailing zeros', () => {
    expect(formatNumber(1.041584)).toBe('1.04');
    expect(formatNumber(2.5)).toBe('2.5');
    expect(formatNumber(1200)).toBe('1200');
    expect(formatNumber(null)).toBe('-');
    expect(formatNumber(0.000012)).toBe('1.20e-5');
  });

  it('formatMetres, formatPercent, formatP, formatDuration', () => {
    expect(formatMetres(249.6)).toBe('250 m');
    expect(formatMetres(7.25)).toBe('7.3 m');
    expect(formatPercent(0.843)).toBe('84 %');
    expect(formatP(0.0004)).toBe('0.0004');
    expect(formatP(0.01)).toBe('0.01');
    expect(formatP(0)).toBe('< 1e-300');
    expect(formatDuration(185)).toBe('3 min 05 s');
    expect(formatDuration(42.4)).toBe('42 s');
    expect(formatDuration(null)).toBe('-');
  });
});
