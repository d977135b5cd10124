import { describe, expect, it } from 'vitest';
import { ApiTokens } from '../../src/http/api-tokens.js';

const read = 'r'.repeat(24);
const write = 'w'.repeat(24);

describe('ApiTokens.identify', () => {
  it('names the same principal for a header it has seen before, and still refuses unknown tokens', () => {
    const tokens = new ApiTokens([
      { name: 'mes', scope: 'read', token: read },
      { name: 'line-1', scope: 'write', token: write },
    ]);
    for (let i = 0; i < 3; i++) {
      expect(tokens.identify(`Bearer ${read}`)).toEqual({ name: 'mes', scope: 'read' });
      expect(tokens.identify(`Bearer ${write}`)).toEqual({ name: 'line-1', scope: 'write' });
      expect(tokens.identify(`Bearer ${read}x`)).toBeNull();
      expect(tokens.identify(`Bearer ${write.slice(1)}`)).toBeNull();
      expect(tokens.identify(read)).toBeNull();
    }
  });

  it('keeps recognising a token after many other headers were seen', () => {
    const tokens = new ApiTokens([{ name: 'mes', scope: 'read', token: read }]);
    for (let i = 0; i < 1000; i++) expect(tokens.identify(`Bearer ${'x'.repeat(20)}${i}`)).toBeNull();
    expect(tokens.identify(`bearer   ${read}`)).toEqual({ name: 'mes', scope: 'read' });
    expect(tokens.identify(`Bearer ${read}`)).toEqual({ name: 'mes', scope: 'read' });
  });
});
