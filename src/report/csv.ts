// A small CSV writer per RFC 4180 (section 2): fields separated by commas, records ended by CRLF, a field quoted
// when it holds a comma, a double quote, CR or LF, and a double quote inside a quoted field written twice.
// Numbers go out as plain decimals (no exponent, no thousands separator) so any spreadsheet reads them the same.

/** One field, quoted only when RFC 4180 requires it. */
export function csvField(text: string): string {
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

/** One record with its CRLF line end. */
export function csvRecord(fields: string[]): string {
  return `${fields.map(csvField).join(',')}\r\n`;
}

/** A finite number as a plain decimal rounded to `significant` digits: 4700 → "4700", 5e-5 → "0.00005",
 * 0.1 + 0.2 → "0.3". Throws on NaN or Infinity (no such figure may reach a file). */
export function plainNumber(value: number, significant = 6): string {
  if (!Number.isFinite(value)) throw new RangeError(`plainNumber: not a finite number (${value})`);
  if (value === 0) return '0';
  const rounded = Number(value.toPrecision(significant));
  const exponent = Math.floor(Math.log10(Math.abs(rounded)));
  const decimals = Math.min(100, Math.max(0, significant - 1 - exponent));
  const text = rounded.toFixed(decimals);
  return text.includes('.') ? text.replace(/\.?0+$/, '') : text;
}
