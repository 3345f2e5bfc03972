import { describe, expect, it } from 'vitest';
import { makeExample, makeGuideExamples, seededRandom } from '@/features/deck/lib/guide-examples';

const mean = (values: number[]) => values.reduce((a, b) => a + b, 0) / values.length;

describe('the guide’s example cards', () => {
  it('are the same for the same seed, and differ for another', () => {
    expect(makeGuideExamples(7)).toEqual(makeGuideExamples(7));
    expect(makeGuideExamples(7)).not.toEqual(makeGuideExamples(8));
    expect(Array.from({ length: 3 }, seededRandom(1))).toEqual(Array.from({ length: 3 }, seededRandom(1)));
  });

  it('are a transit, an eclipsing binary, a jump after a gap and a flat star, in that order', () => {
    expect(makeGuideExamples().map((example) => example.kind)).toEqual([
      'transit',
      'eclipsing-binary',
      'jump-after-gap',
      'flat',
    ]);
  });

  it('have the shapes they are meant to teach', () => {
    const inWindow = (example: ReturnType<typeof makeExample>, from: number, to: number) =>
      example.ppm.filter((_, i) => example.hours[i]! >= from && example.hours[i]! <= to);
    const transit = makeExample('transit', 3);
    // Flat-bottomed: the middle of the dip is as deep as its shoulders' inner edge.
    expect(mean(inWindow(transit, 5.6, 7.2))).toBeLessThan(-1200);
    expect(Math.abs(mean(inWindow(transit, 0, 4)))).toBeLessThan(150);
    const binary = makeExample('eclipsing-binary', 3);
    // V-shaped: much deeper at the centre than halfway out.
    expect(mean(inWindow(binary, 5.4, 5.8))).toBeLessThan(mean(inWindow(binary, 4.4, 4.6)) - 2000);
    const jump = makeExample('jump-after-gap', 3);
    expect(jump.hours.some((hour) => hour > 5.3 && hour < 7.3)).toBe(false);
    expect(mean(inWindow(jump, 7.5, 12)) - mean(inWindow(jump, 0, 5))).toBeGreaterThan(900);
    const flat = makeExample('flat', 3);
    expect(Math.abs(mean(flat.ppm))).toBeLessThan(100);
    expect(flat.hours).toHaveLength(121);
  });
});
