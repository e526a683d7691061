// Builds the InputError for malformed notation: it names the offending character and its position (1-based).
import { InputError } from '../errors.js';
import { printableText } from '../user-text.js';

/** A character that breaks the notation at `index` (0-based) of `text`. */
export function unexpectedCharacter(where: string, text: string, index: number, accepted: string): InputError {
  if (index >= text.length) {
    return new InputError(where, `'${printableText(text)}' ends too early`, accepted);
  }
  const ch = String.fromCodePoint(text.codePointAt(index) ?? 0);
  return new InputError(where, `unexpected character '${printableText(ch)}' at position ${index + 1} in '${printableText(text)}'`, accepted);
}
