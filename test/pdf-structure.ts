// Reads what the browser test needs from a tagged PDF that Chromium printed: the page count, and for each figure
// (an SVG chart with role="img" and an aria-label) the pages its marked content lies on. A figure whose content is
// cut across pages has a /K array naming marked-content references on more than one page (ISO 32000-1:2008,
// 14.7.2 structure tree, 14.7.4.3 marked-content references). Chromium writes these dictionaries uncompressed.

export interface PdfFigure {
  alt: string;
  /** Object numbers of the pages the figure's content lies on. */
  pages: number[];
}

export function pdfPageCount(pdf: Buffer): number {
  return (pdf.toString('latin1').match(/\/Type\s*\/Page\b/g) ?? []).length;
}

/** The structure elements of type /Figure with their /Alt text and the pages of their content. */
export function pdfFigures(pdf: Buffer): PdfFigure[] {
  const text = pdf.toString('latin1');
  const figures: PdfFigure[] = [];
  for (const match of text.matchAll(/\/S \/Figure\s*\/Alt \(((?:[^()\\]|\\.)*)\)\s*\/P \d+ 0 R\s*\/Pg (\d+) 0 R\s*\/K (\d+|\[[^\]]*\])/g)) {
    const pages = new Set<number>([Number(match[2])]);
    for (const ref of match[3]!.matchAll(/\/Pg (\d+) 0 R/g)) pages.add(Number(ref[1]));
    figures.push({ alt: match[1]!.replace(/\\(.)/g, '$1'), pages: [...pages] });
  }
  return figures;
}
