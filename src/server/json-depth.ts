/**
 * The nesting cap on request bodies. JSON.parse builds a value of any depth, but a value nested
 * thousands of levels deep overflows the stack of whatever walks it later by recursion (the
 * structured clone that hands a task to a worker thread, JSON.stringify, a schema's error
 * path), so the JSON parser refuses such bodies before parsing them.
 */

/**
 * Deepest nesting of arrays and objects a request body may have. An uploaded track nests 5
 * levels (track, centerline, spline, controlPoints, point), a batch with a reference manifest 6.
 */
export const MAX_JSON_DEPTH = 64;

/**
 * Whether JSON text nests arrays and objects deeper than `max` levels: one pass over the text
 * that skips strings (and the escapes in them), with no recursion and no allocation. Text that
 * is not JSON may be counted wrongly; the parser refuses it anyway.
 * @example jsonDepthExceeds('[[1]]', 1) // true
 */
export function jsonDepthExceeds(text: string, max: number): boolean {
  let depth = 0;
  let inString = false;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (inString) {
      // a backslash escapes the next character (an escaped quote does not end the string)
      if (c === BACKSLASH) i++;
      else if (c === QUOTE) inString = false;
    } else if (c === QUOTE) {
      inString = true;
    } else if (c === OPEN_BRACKET || c === OPEN_BRACE) {
      if (++depth > max) return true;
    } else if (c === CLOSE_BRACKET || c === CLOSE_BRACE) {
      depth--;
    }
  }
  return false;
}

const QUOTE = 0x22;
const BACKSLASH = 0x5c;
const OPEN_BRACKET = 0x5b;
const CLOSE_BRACKET = 0x5d;
const OPEN_BRACE = 0x7b;
const CLOSE_BRACE = 0x7d;
