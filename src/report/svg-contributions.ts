// The contributors chart: each part's share of the output variance as a horizontal bar, largest first.
// Bars are `rect.contribution[data-part][data-share]` (share as an exact fraction).
import type { OutputResult } from '../analysis/result.js';
import { formatShare } from './format-value.js';
import { coordinate, escapeHtml, exact } from './html-escape.js';

/** Parts below this share of the variance are summed into one line rather than drawn (0.1 %). */
export const SMALLEST_SHARE_DRAWN = 0.001;

/** The contributions the chart draws: the largest, at most maxParts, each at least SMALLEST_SHARE_DRAWN. */
export function drawnContributions(output: OutputResult, maxParts = 10): OutputResult['contributions'] {
  return output.contributions.filter((c) => c.varianceShare >= SMALLEST_SHARE_DRAWN).slice(0, maxParts);
}

export function renderSvgContributions(output: OutputResult, maxParts = 10): string {
  const rows = drawnContributions(output, maxParts);
  const rest = output.contributions.slice(rows.length);
  const restShare = rest.reduce((sum, c) => sum + c.varianceShare, 0);
  const rowH = 22;
  const labelW = 150;
  const barW = 420;
  const width = labelW + barW + 80;
  const height = (Math.max(1, rows.length) + (rest.length > 0 ? 1 : 0)) * rowH + 8;
  const parts: string[] = [
    `<svg xmlns="http://www.w3.org/2000/svg" class="contributions" data-output="${escapeHtml(output.name)}" viewBox="0 0 ${width} ${height}" width="${width}" height="${height}" role="img" aria-label="${escapeHtml(output.name)}: share of variance by part">`,
  ];
  if (rows.length === 0) parts.push(`<text x="4" y="16">no part varies</text>`);
  rows.forEach((c, i) => {
    const y = 4 + i * rowH;
    const w = Math.max(0, Math.min(1, c.varianceShare)) * barW;
    parts.push(
      `<text class="part-label" x="${labelW - 6}" y="${y + 15}" text-anchor="end">${escapeHtml(c.part)}</text>`,
      `<rect class="contribution" data-part="${escapeHtml(c.part)}" data-share="${exact(c.varianceShare)}" x="${labelW}" y="${y + 3}" width="${coordinate(w)}" height="${rowH - 6}"/>`,
      `<text class="share-label" x="${coordinate(labelW + w + 6)}" y="${y + 15}">${escapeHtml(formatShare(c.varianceShare))}</text>`,
    );
  });
  if (rest.length > 0) {
    parts.push(
      `<text class="rest-label" x="${labelW - 6}" y="${4 + rows.length * rowH + 15}" data-parts="${rest.length}">${rest.length} more part${rest.length === 1 ? '' : 's'}, ${escapeHtml(formatShare(restShare))} together</text>`,
    );
  }
  parts.push('</svg>');
  return parts.join('\n');
}
