import { afterEach, describe, expect, it, vi } from 'vitest';
import {
  audienceText,
  handledCount,
  insertAtSelection,
  localDateTimeToIso,
  newsletterPollInterval,
  PERSONAL_FIELDS,
  progressFraction,
  sandboxedPreview,
  toLocalDateTimeValue,
} from '@/features/lab/lib/newsletters';
import { PERSONAL_FIELDS as SERVER_FIELDS } from '../../../../../../server/mail/personal-fields';

const progress = (over: Partial<Parameters<typeof handledCount>[0]> = {}) => ({
  recipients: 10,
  queued: 4,
  sending: 1,
  sent: 2,
  failed: 1,
  skippedUnsubscribed: 1,
  unknown: 1,
  ...over,
});

afterEach(() => {
  vi.unstubAllEnvs();
});

describe('PERSONAL_FIELDS', () => {
  it('lists the same fields, in the same order and words, as the server fills in', () => {
    expect(PERSONAL_FIELDS).toEqual(SERVER_FIELDS);
  });
});

describe('insertAtSelection', () => {
  it('replaces the selection and puts the caret after the insert', () => {
    expect(insertAtSelection('Hello there', 6, 11, '{{displayName}}')).toEqual({
      text: 'Hello {{displayName}}',
      caret: 21,
    });
  });
  it('inserts at the caret when nothing is selected, and clamps positions past the end', () => {
    expect(insertAtSelection('ab', 1, 1, 'X')).toEqual({ text: 'aXb', caret: 2 });
    expect(insertAtSelection('ab', 9, 9, 'X')).toEqual({ text: 'abX', caret: 3 });
  });
});

describe('audienceText', () => {
  it('names each audience in words, with the campaign name when known', () => {
    expect(audienceText({ kind: 'opted-in' })).toBe('Everyone who opted in');
    expect(audienceText({ kind: 'active', days: 30 })).toBe('Opted in and active in the last 30 days');
    expect(audienceText({ kind: 'active', days: 1 })).toBe('Opted in and active in the last day');
    expect(audienceText({ kind: 'campaign', campaignId: 3 }, () => 'Sector 12')).toBe(
      'Opted in and gave verdicts in “Sector 12”',
    );
    expect(audienceText({ kind: 'campaign', campaignId: 3 })).toBe(
      'Opted in and gave verdicts in campaign 3',
    );
  });
});

describe('progress', () => {
  it('counts every reader the sender has dealt with, unknown included, but not the queued', () => {
    expect(handledCount(progress())).toBe(6);
    expect(progressFraction(progress())).toBeCloseTo(0.6);
  });
  it('has no fraction before the audience is fixed, and an empty audience is complete', () => {
    expect(progressFraction(progress({ recipients: null }))).toBeNull();
    expect(
      progressFraction(
        progress({
          recipients: 0,
          queued: 0,
          sending: 0,
          sent: 0,
          failed: 0,
          skippedUnsubscribed: 0,
          unknown: 0,
        }),
      ),
    ).toBe(1);
  });
});

describe('newsletterPollInterval', () => {
  it('polls every two seconds while any is sending or scheduled, and not otherwise', () => {
    expect(newsletterPollInterval(['sent', 'sending'])).toBe(2000);
    expect(newsletterPollInterval(['scheduled'])).toBe(2000);
    expect(newsletterPollInterval(['draft', 'sent', 'cancelled'])).toBe(false);
    expect(newsletterPollInterval([])).toBe(false);
  });
});

describe('localDateTimeToIso', () => {
  it('reads a datetime-local value in the browser time zone', () => {
    const iso = localDateTimeToIso('2026-12-24T09:30');
    expect(iso).toBe(new Date(2026, 11, 24, 9, 30).toISOString());
    expect(toLocalDateTimeValue(new Date(iso!))).toBe('2026-12-24T09:30');
  });
  it('answers null for an empty or malformed value', () => {
    expect(localDateTimeToIso('')).toBeNull();
    expect(localDateTimeToIso('24/12/2026 09:30')).toBeNull();
    expect(localDateTimeToIso('2026-13-40T99:99')).toBeNull();
  });
});

describe('sandboxedPreview', () => {
  it('puts the content security policy after the doctype and before the message', () => {
    const doc = sandboxedPreview(
      '<!doctype html>\n<html><body><img src="https://x.test/a.png"></body></html>',
    );
    expect(doc.startsWith('<!doctype html><meta http-equiv="Content-Security-Policy"')).toBe(true);
    expect(doc).toContain('img-src data:');
    expect(doc).toContain('<base target="_blank">');
  });
});
