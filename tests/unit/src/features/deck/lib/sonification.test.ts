import { describe, expect, it } from 'vitest';
import { frequencyForPpm, highestHz, lowestHz, sonify } from '@/features/deck/lib/sonification';

describe('frequencyForPpm', () => {
  it('plays the faintest value lowest and the brightest highest, two octaves apart', () => {
    expect(frequencyForPpm(-2000, -2000, 500)).toBeCloseTo(lowestHz);
    expect(frequencyForPpm(500, -2000, 500)).toBeCloseTo(highestHz);
    expect(highestHz / lowestHz).toBe(4);
  });

  it('moves on a log scale: halfway in brightness is the geometric middle, one octave up', () => {
    expect(frequencyForPpm(0, -1000, 1000)).toBeCloseTo(440);
  });

  it('clamps values outside the range, and plays a flat card at one pitch', () => {
    expect(frequencyForPpm(-5000, -1000, 1000)).toBeCloseTo(lowestHz);
    expect(frequencyForPpm(3, 3, 3)).toBeCloseTo(440);
  });
});

describe('sonify', () => {
  it('falls in pitch where the light dips and comes back after, in time order over the play time', () => {
    const hours = Array.from({ length: 241 }, (_, i) => i * 0.05);
    const ppm = hours.map((hour) => (hour > 5 && hour < 7 ? -1500 : 0));
    const tones = sonify(hours, ppm, 4);
    expect(tones[0]!.atS).toBeLessThan(0.05);
    expect(tones[tones.length - 1]!.atS).toBeLessThanOrEqual(4);
    for (let i = 1; i < tones.length; i += 1) expect(tones[i]!.atS).toBeGreaterThan(tones[i - 1]!.atS);
    const at = (second: number) =>
      tones.reduce((best, tone) => (Math.abs(tone.atS - second) < Math.abs(best.atS - second) ? tone : best));
    expect(at(0.5).frequencyHz).toBeCloseTo(highestHz);
    expect(at(2).frequencyHz).toBeCloseTo(lowestHz);
    expect(at(3.5).frequencyHz).toBeCloseTo(highestHz);
  });

  it('gives nothing for an empty card', () => {
    expect(sonify([], [])).toEqual([]);
  });
});
