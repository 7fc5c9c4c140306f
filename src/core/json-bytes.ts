/**
 * JSON text written straight into bytes: the same text as `JSON.stringify(value)` for the plain
 * data a track is made of (objects, arrays, strings, finite numbers, booleans, null), about
 * three times as fast on a track, because most of a track is numbers with at most nine decimals and
 * those are written from integers here instead of through the general double-to-text routine.
 *
 * Why the text is the same: `JSON.stringify` writes a number as the shortest decimal that reads
 * back as the same double. For |x| in [1e-6, 1e6) that is an exact multiple of 1e-9 (the test
 * `k / 1e9 === x` with k = round(x · 1e9)), k has at most 15 digits, and two different decimals
 * of at most 15 significant digits never read back as the same double (a double carries 15
 * decimal digits faithfully), so k's digits with trailing zeros dropped are that shortest
 * decimal; numbers outside that range or not on the 1e-9 grid go through `String(x)`, which is
 * what `JSON.stringify` uses. Strings go through `JSON.stringify`. Text with a character beyond
 * ASCII is not written here (the caller falls back), so that bytes and UTF-16 text agree.
 */

import { createHash } from 'node:crypto';

const SCALE = 1e9;
const FRACTION_DIGITS = 9;
const MAX_DIGITS_VALUE = 1e15;

/** Integers below SMALL are written from a table of their digits (4 bytes per number). */
const SMALL = 10_000;
const SMALL_DIGITS = new Uint8Array(4 * SMALL);
const SMALL_LENGTH = new Uint8Array(SMALL);
/** '.' and the decimals of f / 1000 for 0 < f < 1000, trailing zeros dropped (4 bytes each). */
const MILLI_TEXT = new Uint8Array(4 * 1000);
const MILLI_LENGTH = new Uint8Array(1000);
for (let v = 0; v < SMALL; v++) {
  const text = String(v);
  SMALL_LENGTH[v] = text.length;
  for (let k = 0; k < text.length; k++) SMALL_DIGITS[4 * v + k] = text.charCodeAt(k);
}
for (let f = 1; f < 1000; f++) {
  const text = `.${String(f).padStart(3, '0')}`.replace(/0+$/, '');
  MILLI_LENGTH[f] = text.length;
  for (let k = 0; k < text.length; k++) MILLI_TEXT[4 * f + k] = text.charCodeAt(k);
}

/** A growable byte buffer of ASCII JSON text. */
class JsonWriter {
  bytes: Uint8Array;
  length = 0;
  /** Set when a string held a character beyond ASCII; the bytes are then not the text. */
  nonAscii = false;

  constructor(buffer: Uint8Array) {
    this.bytes = buffer;
  }

  private reserve(extra: number): void {
    if (this.length + extra <= this.bytes.length) return;
    let size = this.bytes.length * 2;
    while (size < this.length + extra) size *= 2;
    const grown = new Uint8Array(size);
    grown.set(this.bytes.subarray(0, this.length));
    this.bytes = grown;
  }

  byte(code: number): void {
    this.reserve(1);
    this.bytes[this.length++] = code;
  }

  ascii(text: string): void {
    const n = text.length;
    this.reserve(n);
    const b = this.bytes;
    let at = this.length;
    for (let i = 0; i < n; i++) {
      const c = text.charCodeAt(i);
      if (c > 0x7f) this.nonAscii = true;
      b[at++] = c;
    }
    this.length = at;
  }

  number(x: number): void {
    this.reserve(NUMBER_ROOM);
    const next = putGridNumber(this.bytes, this.length, x);
    if (next >= 0) {
      this.length = next;
      return;
    }
    if (!Number.isFinite(x)) {
      this.ascii('null');
      return;
    }
    // seven to nine decimals
    const a = x < 0 ? -x : x;
    if (a >= 1e-6 && a < 1e6) {
      const k = Math.round(a * SCALE);
      if (k / SCALE === a && k < MAX_DIGITS_VALUE) {
        this.reserve(FRACTION_DIGITS + 18);
        const b = this.bytes;
        let at = this.length;
        if (x < 0) b[at++] = 0x2d;
        const whole = Math.floor(k / SCALE);
        const fraction = (k - whole * SCALE) | 0;
        at = putUnsigned(b, at, whole);
        this.length = fraction === 0 ? at : putDecimals(b, at, fraction, FRACTION_DIGITS);
        return;
      }
    }
    this.ascii(String(x));
  }

  value(v: unknown): void {
    if (typeof v === 'number') this.number(v);
    else if (typeof v === 'string') this.ascii(JSON.stringify(v));
    else if (v === null) this.ascii('null');
    else if (typeof v === 'boolean') this.ascii(v ? 'true' : 'false');
    else if (Array.isArray(v)) this.array(v);
    else if (typeof v === 'object') this.object(v as Record<string, unknown>);
    else throw new TypeError(`jsonBytes: cannot write a ${typeof v}`);
  }

  private array(items: readonly unknown[]): void {
    const n = items.length;
    if (n > 0 && typeof items[0] === 'number') {
      this.numbers(items);
      return;
    }
    if (n > 0 && isPoint(items[0])) {
      this.points(items);
      return;
    }
    this.byte(0x5b);
    for (let i = 0; i < n; i++) {
      if (i > 0) this.byte(0x2c);
      const item = items[i];
      if (item === undefined || typeof item === 'function') this.ascii('null');
      else this.value(item);
    }
    this.byte(0x5d);
  }

  // an array that starts with a number: the common case of a track (coordinates, profiles).
  // Room for every item is reserved at once and the loop writes through locals; an item the fast
  // path does not take is written by valueAt() (the buffer may grow there: reloaded after it).
  private numbers(items: readonly unknown[]): void {
    const n = items.length;
    this.reserve(n * NUMBER_ROOM + 2);
    let b = this.bytes;
    let at = this.length;
    b[at++] = 0x5b;
    for (let i = 0; i < n; i++) {
      if (i > 0) b[at++] = 0x2c;
      const item = items[i];
      const next = typeof item === 'number' ? putGridNumber(b, at, item) : -1;
      if (next >= 0) {
        at = next;
        continue;
      }
      this.length = at;
      this.valueAt(items, i);
      this.reserve((n - i) * NUMBER_ROOM + 2);
      b = this.bytes;
      at = this.length;
    }
    b[at++] = 0x5d;
    this.length = at;
  }

  // an array that starts with an [x, y] pair: points, wall faces, control points (as numbers())
  private points(items: readonly unknown[]): void {
    const n = items.length;
    this.reserve(n * POINT_ROOM + 2);
    let b = this.bytes;
    let at = this.length;
    b[at++] = 0x5b;
    for (let i = 0; i < n; i++) {
      if (i > 0) b[at++] = 0x2c;
      const item = items[i];
      if (isPoint(item)) {
        b[at++] = 0x5b;
        let next = putGridNumber(b, at, item[0]);
        if (next >= 0) {
          b[next++] = 0x2c;
          next = putGridNumber(b, next, item[1]);
          if (next >= 0) {
            b[next++] = 0x5d;
            at = next;
            continue;
          }
        }
        // a coordinate off the grids: the whole pair again, item by item
        at--;
      }
      this.length = at;
      this.valueAt(items, i);
      this.reserve((n - i) * POINT_ROOM + 2);
      b = this.bytes;
      at = this.length;
    }
    b[at++] = 0x5d;
    this.length = at;
  }

  // item i of an array, as an array item: undefined and functions are null
  private valueAt(items: readonly unknown[], i: number): void {
    const item = items[i];
    if (item === undefined || typeof item === 'function') this.ascii('null');
    else this.value(item);
  }

  private object(o: Record<string, unknown>): void {
    if (typeof (o as { toJSON?: unknown }).toJSON === 'function') {
      throw new TypeError('jsonBytes: objects with toJSON are not written here');
    }
    this.byte(0x7b);
    let first = true;
    for (const key of Object.keys(o)) {
      const item = o[key];
      if (item === undefined || typeof item === 'function') continue;
      if (!first) this.byte(0x2c);
      first = false;
      this.key(key);
      this.value(item);
    }
    this.byte(0x7d);
  }

  // `"key":`, from the cache of keys met before (a track repeats a few dozen keys hundreds of times)
  private key(key: string): void {
    let text = KEY_TEXT.get(key);
    if (text === undefined) {
      const json = `${JSON.stringify(key)}:`;
      // a character beyond ASCII does not fit a byte: written (and flagged) by ascii(), uncached
      if (KEY_TEXT.size >= MAX_CACHED_KEYS || /[^\x00-\x7f]/.test(json)) {
        this.ascii(json);
        return;
      }
      text = new Uint8Array(json.length);
      for (let k = 0; k < json.length; k++) text[k] = json.charCodeAt(k);
      KEY_TEXT.set(key, text);
    }
    const n = text.length;
    this.reserve(n);
    const b = this.bytes;
    let at = this.length;
    for (let k = 0; k < n; k++) b[at++] = text[k];
    this.length = at;
  }
}

/** Keys written before, as the bytes of `"key":` (ASCII keys only, at most MAX_CACHED_KEYS). */
const KEY_TEXT = new Map<string, Uint8Array>();
/** Bounds the key cache for data with ever new keys; a track has under a hundred distinct keys. */
const MAX_CACHED_KEYS = 1024;

/** Bytes reserved per number of an array: ',', sign, 6 whole digits, '.', 6 decimals and the 3 bytes a table copy may write beyond them. */
const NUMBER_ROOM = 20;
/** Bytes reserved per [x, y] item of an array. */
const POINT_ROOM = 2 * NUMBER_ROOM + 4;

/**
 * x written at b[at] when it is 0 or a multiple of 1e-6 with |x| in [1e-6, 1e6) (millimetres
 * and the six-decimal profiles: most of a track), the same text as `JSON.stringify` (see the top
 * of this file; the grid test is `k / 1e6 === |x|`); returns the position after it, or -1 for
 * any other number (then what was written is garbage the caller overwrites). Writes up to 3 bytes
 * beyond the text (whole 4-byte table entries): the caller reserved NUMBER_ROOM. Kept small
 * (358 bytes of bytecode; V8 inlines up to 460) so that it is inlined into the array loops and
 * the double read from an array is not boxed for a call.
 */
function putGridNumber(b: Uint8Array, at: number, x: number): number {
  if (x === 0) {
    b[at] = 0x30; // also -0, which JSON writes as 0
    return at + 1;
  }
  const a = x < 0 ? -x : x;
  if (!(a >= 1e-6 && a < 1e6)) return -1;
  const m = Math.round(a * 1000);
  let micro = 0;
  if (m / 1000 !== a) {
    micro = Math.round(a * 1e6);
    if (micro / 1e6 !== a) return -1;
  }
  if (x < 0) b[at++] = 0x2d;
  const whole = a | 0;
  at = putUnsigned(b, at, whole);
  // six decimals, not on the millimetre grid
  if (micro !== 0) return putDecimals(b, at, (micro - whole * 1e6) | 0, 6);
  const milli = m - whole * 1000;
  if (milli === 0) return at;
  const from = 4 * milli;
  b[at] = MILLI_TEXT[from];
  b[at + 1] = MILLI_TEXT[from + 1];
  b[at + 2] = MILLI_TEXT[from + 2];
  b[at + 3] = MILLI_TEXT[from + 3];
  return at + MILLI_LENGTH[milli];
}

// 0 <= v < 2^31 in decimal at b[at] (below 10 000 as a whole 4-byte table entry: up to 3 bytes
// beyond the digits are written); returns the position after the digits
function putUnsigned(b: Uint8Array, at: number, v: number): number {
  if (v < SMALL) {
    const from = 4 * v;
    b[at] = SMALL_DIGITS[from];
    b[at + 1] = SMALL_DIGITS[from + 1];
    b[at + 2] = SMALL_DIGITS[from + 2];
    b[at + 3] = SMALL_DIGITS[from + 3];
    return at + SMALL_LENGTH[v];
  }
  let digits = 5;
  for (let t = v; t >= 100_000; t = (t / 10) | 0) digits++;
  const end = at + digits;
  for (let t = v, k = end; k > at; ) {
    const q = (t / 10) | 0;
    b[--k] = 0x30 + (t - q * 10);
    t = q;
  }
  return end;
}

// '.' and the `digits` decimals of 0 < t < 10^digits at b[at], trailing zeros dropped; returns
// the position after them
function putDecimals(b: Uint8Array, at: number, t: number, digits: number): number {
  for (let q = (t / 10) | 0; t === q * 10; q = (t / 10) | 0) {
    t = q;
    digits--;
  }
  b[at] = 0x2e;
  const end = at + 1 + digits;
  for (let k = end; k > at + 1; ) {
    const q = (t / 10) | 0;
    b[--k] = 0x30 + (t - q * 10);
    t = q;
  }
  return end;
}

// an array of exactly two numbers
function isPoint(v: unknown): v is readonly [number, number] {
  return Array.isArray(v) && v.length === 2 && typeof v[0] === 'number' && typeof v[1] === 'number';
}

/** The writer's buffer, kept between calls (the core is synchronous, so one at a time uses it). */
let scratch: Uint8Array = new Uint8Array(1 << 16);

/**
 * The UTF-8 bytes of `JSON.stringify(value)` and their hex sha256, or null when the text would
 * hold a character beyond ASCII (then use JSON.stringify and hash the text). The bytes are a
 * view of a buffer the next call overwrites: copy what must outlive it. No string is made: a
 * track's text (140 kB for the default request) would be a string in V8's large-object space,
 * and making one there costs about as much as writing the text.
 *
 * @param value plain data: objects, arrays, strings, numbers, booleans, null (typed arrays,
 *   Maps, bigint and objects with toJSON are not supported)
 * @example new TextDecoder().decode(jsonBytesWithSha256({ a: [1.5, 2] })?.bytes) // '{"a":[1.5,2]}'
 */
export function jsonBytesWithSha256(value: unknown): { readonly bytes: Uint8Array; readonly sha256: string } | null {
  const w = new JsonWriter(scratch);
  w.value(value);
  scratch = w.bytes;
  if (w.nonAscii) return null;
  const bytes = w.bytes.subarray(0, w.length);
  return { bytes, sha256: createHash('sha256').update(bytes).digest('hex') };
}
