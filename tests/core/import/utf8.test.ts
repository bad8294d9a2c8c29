// The importer's own UTF-8 decoder (src/core/import/utf8.ts) checked against the platform's TextDecoder and
// TextEncoder, which implement the WHATWG Encoding Standard (https://encoding.spec.whatwg.org/#utf-8-decoder):
// every maximal invalid subpart becomes one U+FFFD.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { decodeUtf8, encodeUtf8, Utf8StreamDecoder } from '../../../src/core/import/utf8';

const reference = (bytes: Uint8Array): string => new TextDecoder('utf-8', { ignoreBOM: true }).decode(bytes);

/** Bytes that are mostly UTF-8 text with some invalid, cut and overlong sequences mixed in. */
const bytesArb = fc.oneof(
  fc.uint8Array({ maxLength: 64 }),
  fc.array(fc.oneof(fc.string({ unit: 'binary', maxLength: 8 }).map((s) => Array.from(new TextEncoder().encode(s))), fc.constantFrom([0xc0, 0xaf], [0xe0, 0x80, 0x80], [0xed, 0xa0, 0x80], [0xf4, 0x90, 0x80, 0x80], [0xf0, 0x9f], [0xe2, 0x82], [0xc2], [0xbf], [0xfe], [0xef, 0xbb, 0xbf])), { maxLength: 12 }).map((parts) => Uint8Array.from(parts.flat())),
);

describe('decodeUtf8 and Utf8StreamDecoder match TextDecoder (fast-check)', () => {
  it('decodeUtf8(bytes) equals TextDecoder.decode(bytes), invalid sequences included', () => {
    fc.assert(fc.property(bytesArb, (bytes) => {
      expect(decodeUtf8(bytes)).toBe(reference(bytes));
    }), { seed: 7, numRuns: 3000 });
  });

  it('decodeUtf8(bytes, start, end) decodes the range only', () => {
    const bytes = new TextEncoder().encode('a,µ,€,😀');
    expect(decodeUtf8(bytes, 2, 4)).toBe('µ');
    expect(decodeUtf8(bytes, 2, 3)).toBe('\uFFFD'); // a cut 2-byte sequence
  });

  it('Utf8StreamDecoder.decode(chunks cut anywhere) joins to TextDecoder.decode(all bytes)', () => {
    fc.assert(
      fc.property(bytesArb, fc.array(fc.nat(), { maxLength: 6 }), (bytes, cuts) => {
        const points = [...new Set(cuts.map((c) => c % (bytes.length + 1)))].sort((a, b) => a - b);
        const decoder = new Utf8StreamDecoder();
        let text = '';
        let from = 0;
        for (const p of [...points, bytes.length]) {
          text += decoder.decode(bytes.subarray(from, p));
          from = p;
        }
        text += decoder.decode(new Uint8Array(0), true);
        expect(text).toBe(reference(bytes));
        expect(decoder.pending).toBe(false);
      }),
      { seed: 8, numRuns: 3000 },
    );
  });

  it('encodeUtf8(text) equals TextEncoder.encode(text), lone surrogates included', () => {
    fc.assert(fc.property(fc.string({ unit: 'binary', maxLength: 40 }), (text) => {
      expect(Array.from(encodeUtf8(text))).toEqual(Array.from(new TextEncoder().encode(text)));
    }), { seed: 9, numRuns: 2000 });
  });
});
