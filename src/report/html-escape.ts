// Escaping for text and attribute values placed in HTML and inline SVG.
const ENTITIES: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' };

export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => ENTITIES[c]);
}

/** A number for an SVG coordinate: finite, at most two decimals. */
export function coordinate(value: number): string {
  if (!Number.isFinite(value)) throw new Error(`SVG coordinate is not a finite number (${value})`);
  return String(Math.round(value * 100) / 100);
}

/** An exact number for a data attribute (round-trips through Number()). */
export function exact(value: number): string {
  if (!Number.isFinite(value)) throw new Error(`data value is not a finite number (${value})`);
  return String(value);
}

/** The document head every trimfree HTML page starts with: charset, viewport, generator, title and its styles. */
export function htmlDocumentHead(title: string, version: string, style: string): string {
  return `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta name="generator" content="trimfree ${escapeHtml(version)}">
<title>${escapeHtml(title)}</title>
<style>${style}</style>
</head>`;
}
