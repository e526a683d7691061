// The contributors chart: each part's total-effect share of the output variance as a horizontal bar, largest first,
// with its first-order share as a thin bar inside it. Bars are `rect.contribution[data-part][data-share]` (the
// total-effect share as an exact fraction; data-first-order and data-rss-share carry the other two shares).
import type { OutputResult } from '../analysis/result.js';
import { formatShare } from './format-value.js';
import { coordinate, escapeHtml, exact } from './html-escape.js';
import { formatShareWithError } from './variance-budget-lines.js';

/** Parts below this total-effect share of the variance are summed into one line rather than drawn (0.1 %). */
export const SMALLEST_SHARE_DRAWN = 0.001;

/** The contributions the chart draws: the largest, at most maxParts, each at least SMALLEST_SHARE_DRAWN. */
export function drawnContributions(output: OutputResult, maxParts = 10): OutputResult['contributions'] {
  return output.contributions.filter((c) => c.totalEffectShare >= SMALLEST_SHARE_DRAWN).slice(0, maxParts);
}

export function renderSvgContributions(output: OutputResult, maxParts = 10): string {
  const rows = drawnContributions(output, maxParts);
  const rest = output.contributions.slice(rows.length);
  const restShare = rest.reduce((sum, c) => sum + c.totalEffectShare, 0);
  const rowH = 22;
  const labelW = 150;
  const barW = 420;
  const width = labelW + barW + 130;
  const height = (Math.max(1, rows.length) + (rest.length > 0 ? 1 : 0)) * rowH + 8;
  const parts: string[] = [
    `<svg xmlns="http://www.w3.org/2000/svg" class="contributions" data-output="${escapeHtml(output.name)}" viewBox="0 0 ${width} ${height}" width="${width}" height="${height}" role="img" aria-label="${escapeHtml(output.name)}: total-effect share of the variance by part">`,
  ];
  if (rows.length === 0) parts.push(`<text x="4" y="16">no part varies</text>`);
  rows.forEach((c, i) => {
    const y = 4 + i * rowH;
    const w = Math.max(0, Math.min(1, c.totalEffectShare)) * barW;
    const wFirst = Math.max(0, Math.min(1, c.firstOrderShare)) * barW;
    parts.push(
      `<text class="part-label" x="${labelW - 6}" y="${y + 15}" text-anchor="end">${escapeHtml(c.part)}</text>`,
      `<rect class="contribution" data-part="${escapeHtml(c.part)}" data-share="${exact(c.totalEffectShare)}" data-first-order="${exact(c.firstOrderShare)}" data-rss-share="${exact(c.varianceShare)}" x="${labelW}" y="${y + 3}" width="${coordinate(w)}" height="${rowH - 6}"><title>${escapeHtml(`${c.part}: total-effect ${formatShareWithError(c.totalEffectShare, c.totalEffectStandardError)}, first-order ${formatShareWithError(c.firstOrderShare, c.firstOrderStandardError)}, first-order (RSS) ${formatShare(c.varianceShare)}`)}</title></rect>`,
      `<rect class="first-order" x="${labelW}" y="${y + 9}" width="${coordinate(wFirst)}" height="${rowH - 18}"/>`,
      `<text class="share-label" x="${coordinate(labelW + w + 6)}" y="${y + 15}">${escapeHtml(formatShareWithError(c.totalEffectShare, c.totalEffectStandardError))}</text>`,
    );
  });
  if (rest.length > 0) {
    parts.push(
      `<text class="rest-label" x="${labelW - 6}" y="${4 + rows.length * rowH + 15}" data-parts="${rest.length}">${rest.length} more part${rest.length === 1 ? '' : 's'}, total-effect shares summing to ${escapeHtml(formatShare(restShare))}</text>`,
    );
  }
  parts.push('</svg>');
  return parts.join('\n');
}
