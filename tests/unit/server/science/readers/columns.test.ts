import { describe, expect, it } from 'vitest';
import {
  chooseColumns,
  normaliseColumnName,
  timeSystemFromColumnName,
  unitInColumnName,
} from '../../../../../server/science/readers/columns';
import { ReaderError } from '../../../../../server/science/readers/reader-error';

describe('normaliseColumnName and unitInColumnName', () => {
  it.each([
    ['TIME', 'time'],
    ['  "Flux Err" ', 'flux_err'],
    ['BJD-TDB', 'bjd_tdb'],
    ['time [d]', 'time'],
    ['PDCSAP_FLUX (e-/s)', 'pdcsap_flux'],
  ])('normalises %j to %j', (name, normalised) => {
    expect(normaliseColumnName(name)).toBe(normalised);
  });

  it('finds the unit in brackets at the end of a name, or none', () => {
    expect(unitInColumnName('time (h)')).toBe('h');
    expect(unitInColumnName('TIME [ d ]')).toBe('d');
    expect(unitInColumnName('time')).toBeNull();
  });
});

describe('chooseColumns', () => {
  it('prefers PDCSAP_FLUX to SAP_FLUX and pairs the flux with its own error column', () => {
    expect(
      chooseColumns(['TIME', 'SAP_FLUX', 'SAP_FLUX_ERR', 'PDCSAP_FLUX', 'PDCSAP_FLUX_ERR', 'QUALITY']),
    ).toEqual({
      time: 0,
      flux: 3,
      fluxErr: 4,
      quality: 5,
      objectName: null,
    });
  });

  it('falls back to generic error names, flag columns and target columns', () => {
    expect(chooseColumns(['t', 'f', 'sigma', 'flag', 'target'])).toEqual({
      time: 0,
      flux: 1,
      fluxErr: 2,
      quality: 3,
      objectName: 4,
    });
  });

  it('never gives one column two roles when it finds them by name', () => {
    expect(chooseColumns(['time', 'flux', 'err'], { fluxErr: null }).fluxErr).toBeNull();
    expect(() => chooseColumns(['time', 'flux'], { time: null as never })).toThrow(ReaderError);
  });
});

describe('timeSystemFromColumnName', () => {
  it('knows BTJD, BKJD, BJD_TDB and BJD, and says nothing for other names', () => {
    // BTJD = BJD_TDB − 2457000, BKJD = BJD_TDB − 2454833: lightkurve time.py (TimeBTJD, TimeBKJD).
    expect(timeSystemFromColumnName('BTJD').bjdRefDays).toBe(2457000);
    expect(timeSystemFromColumnName('bkjd').bjdRefDays).toBe(2454833);
    expect(timeSystemFromColumnName('BJD_TDB')).toEqual({
      timesys: 'TDB',
      timeref: 'SOLARSYSTEM',
      timeunit: null,
      bjdRefDays: 0,
    });
    expect(timeSystemFromColumnName('bjd').timesys).toBeNull();
    expect(timeSystemFromColumnName('hjd')).toEqual({
      timesys: null,
      timeref: null,
      timeunit: null,
      bjdRefDays: null,
    });
  });
});
