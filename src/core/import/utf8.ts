/**
 * UTF-8 bytes → text for the importer's byte input (pure: no Node APIs). Follows the WHATWG Encoding Standard's
 * UTF-8 decoder (https://encoding.spec.whatwg.org/#utf-8-decoder): each maximal invalid subpart becomes one
 * U+FFFD, exactly as the platform's TextDecoder does (checked against it in tests/core/import/utf8.test.ts).
 * The platform TextDecoder, where the runtime has one (browsers, workers, Node), does the bulk decoding; the
 * code below is the fallback and decodes single lines for the slow path.
 */

interface PlatformDecoder {
  decode(input?: Uint8Array, options?: { stream?: boolean }): string;
}
type PlatformDecoderClass = new (label: string, options?: { ignoreBOM?: boolean }) => PlatformDecoder;

const platformDecoder = (globalThis as { TextDecoder?: PlatformDecoderClass }).TextDecoder;

/**
 * A copy of bytes the caller may reuse (a Node Buffer's slice() is a view, not a copy, so slice() is not used on
 * chunks).
 */
export function copyBytes(bytes: Uint8Array): Uint8Array {
  const out = new Uint8Array(bytes.length);
  out.set(bytes);
  return out;
}

/** Characters converted per String.fromCharCode call (keeps the argument list small). */
const BATCH = 8192;

/** Decodes bytes[start, end) as UTF-8 (a BOM is kept as U+FEFF; an incomplete last sequence becomes U+FFFD). */
export function decodeUtf8(bytes: Uint8Array, start = 0, end = bytes.length): string {
  const parts: string[] = [];
  const codes: number[] = [];
  const flush = (): void => {
    if (codes.length > 0) {
      parts.push(String.fromCharCode(...codes));
      codes.length = 0;
    }
  };
  let i = start;
  while (i < end) {
    const c = bytes[i] as number;
    if (c < 0x80) {
      let j = i + 1;
      while (j < end && (bytes[j] as number) < 0x80 && j - i < BATCH) j++;
      flush();
      parts.push(String.fromCharCode(...bytes.subarray(i, j)));
      i = j;
      continue;
    }
    let need: number;
    let cp: number;
    let lower = 0x80;
    let upper = 0xbf;
    if (c >= 0xc2 && c <= 0xdf) {
      need = 1;
      cp = c & 0x1f;
    } else if (c >= 0xe0 && c <= 0xef) {
      need = 2;
      cp = c & 0x0f;
      if (c === 0xe0) lower = 0xa0;
      if (c === 0xed) upper = 0x9f;
    } else if (c >= 0xf0 && c <= 0xf4) {
      need = 3;
      cp = c & 0x07;
      if (c === 0xf0) lower = 0x90;
      if (c === 0xf4) upper = 0x8f;
    } else {
      codes.push(0xfffd);
      i++;
      continue;
    }
    let j = i + 1;
    let ok = true;
    for (let k = 0; k < need; k++, j++) {
      const d = j < end ? (bytes[j] as number) : -1;
      if (d < lower || d > upper) {
        ok = false;
        break;
      }
      lower = 0x80;
      upper = 0xbf;
      cp = (cp << 6) | (d & 0x3f);
    }
    // an invalid or cut sequence: one U+FFFD for the bytes read so far; the offending byte starts afresh
    if (!ok) codes.push(0xfffd);
    else if (cp > 0xffff) codes.push(0xd800 + ((cp - 0x10000) >> 10), 0xdc00 + ((cp - 0x10000) & 0x3ff));
    else codes.push(cp);
    i = j;
    if (codes.length >= BATCH) flush();
  }
  flush();
  return parts.join('');
}

/** Length of the incomplete UTF-8 sequence at the end of bytes (0–3 bytes that need more input). */
function incompleteTail(bytes: Uint8Array): number {
  const n = bytes.length;
  for (let back = 1; back <= 3 && back <= n; back++) {
    const c = bytes[n - back] as number;
    if (c < 0x80) return 0;
    if (c >= 0xc0) {
      const len = c >= 0xf0 ? 4 : c >= 0xe0 ? 3 : 2;
      return len > back ? back : 0;
    }
  }
  return 0;
}

/** A streaming UTF-8 decoder: a character cut between two chunks is completed by the next one. */
export class Utf8StreamDecoder {
  private readonly platform: PlatformDecoder | null = platformDecoder ? new platformDecoder('utf-8', { ignoreBOM: true }) : null;
  private tail: Uint8Array | null = null;

  /** True when the last chunk ended inside a character. */
  get pending(): boolean {
    return this.tail !== null;
  }

  /** Decodes the next chunk; with `final`, an incomplete last character becomes U+FFFD. */
  decode(chunk: Uint8Array, final = false): string {
    let bytes = chunk;
    if (this.tail) {
      bytes = new Uint8Array(this.tail.length + chunk.length);
      bytes.set(this.tail);
      bytes.set(chunk, this.tail.length);
      this.tail = null;
    }
    const cut = final ? 0 : incompleteTail(bytes);
    if (cut > 0) this.tail = copyBytes(bytes.subarray(bytes.length - cut));
    const body = bytes.subarray(0, bytes.length - cut);
    // whole characters only go to the platform decoder, so it never holds state of its own
    return this.platform ? this.platform.decode(body) : decodeUtf8(body);
  }
}

/** Text → UTF-8 bytes (lone surrogates become U+FFFD, as TextEncoder does). For short pieces of text. */
export function encodeUtf8(text: string): Uint8Array {
  const out: number[] = [];
  for (let i = 0; i < text.length; i++) {
    let cp = text.charCodeAt(i);
    if (cp >= 0xd800 && cp <= 0xdfff) {
      const lo = text.charCodeAt(i + 1);
      if (cp <= 0xdbff && lo >= 0xdc00 && lo <= 0xdfff) {
        cp = 0x10000 + ((cp - 0xd800) << 10) + (lo - 0xdc00);
        i++;
      } else cp = 0xfffd;
    }
    if (cp < 0x80) out.push(cp);
    else if (cp < 0x800) out.push(0xc0 | (cp >> 6), 0x80 | (cp & 0x3f));
    else if (cp < 0x10000) out.push(0xe0 | (cp >> 12), 0x80 | ((cp >> 6) & 0x3f), 0x80 | (cp & 0x3f));
    else out.push(0xf0 | (cp >> 18), 0x80 | ((cp >> 12) & 0x3f), 0x80 | ((cp >> 6) & 0x3f), 0x80 | (cp & 0x3f));
  }
  return Uint8Array.from(out);
}
