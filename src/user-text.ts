// Text a user (or a hostile file) supplied, made safe to put in a one-line message on a terminal: control characters
// (ESC, CR, NUL, …) are shown escaped as \x1b, \r, \x00, so a file cannot send terminal escape sequences or overwrite
// the `trimfree:` line, and long text is cut to a stated length with an ellipsis, so a 10 MB key is not a 20 MB line.
// Any layer may import this file (like errors.ts): it holds one pure function and imports nothing.

/** Longest user text a message shows, in characters, before it is cut with "…". */
export const MAX_SHOWN_TEXT = 80;

const ESCAPES: Record<string, string> = { '\n': '\\n', '\r': '\\r', '\t': '\\t' };

/** `text` with control characters escaped and cut to `max` characters (the ellipsis included). */
export function printableText(text: string, max = MAX_SHOWN_TEXT): string {
  // Cut first (so a huge text costs nothing more), then escape: an escape never splits.
  const cut = text.length > max ? `${text.slice(0, max - 1)}…` : text;
  // C0 controls, DEL, C1 controls, and the line and paragraph separators and bidirectional overrides that can
  // reorder or break a line on a terminal.
  return cut.replace(/[\u0000-\u001f\u007f-\u009f\u2028\u2029\u202a-\u202e\u2066-\u2069]/g, (c) => ESCAPES[c] ?? escapeCode(c));
}

function escapeCode(c: string): string {
  const code = c.charCodeAt(0);
  return code < 0x100 ? `\\x${code.toString(16).padStart(2, '0')}` : `\\u${code.toString(16).padStart(4, '0')}`;
}
