import { describe, expect, it } from 'vitest';
import { messageNumber, ratioText } from '../../src/process/index.js';

describe('messageNumber', () => {
  it.each([
    [37223.196, '37 200'],
    [177836, '178 000'],
    [0.998123, '0.998'],
    [1.584, '1.58'],
    [1.3, '1.3'],
    [0.00032, '0.00032'],
    [2048, '2050'],
    [99.96, '100'],
    [-0.5, '-0.5'],
    [0, '0'],
  ])('messageNumber(%s) is "%s" (three significant figures)', (x, text) => {
    expect(messageNumber(x)).toBe(text);
  });
});

describe('ratioText', () => {
  it('writes 8.4512 as "about 8.45×" and 37 223 as "more than 1000×"', () => {
    expect(ratioText(8.4512)).toBe('about 8.45×');
    expect(ratioText(37223.196)).toBe('more than 1000×');
    expect(ratioText(1000)).toBe('about 1000×');
  });
});
