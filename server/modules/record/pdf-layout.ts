/** Small layout pieces for chart documents drawn with pdfkit: headings, facts in pairs, ruled tables. */

const INK = '#14181f';
const MUTED = '#3b4452';
const RULE = '#d3cab7';
const HEAD_FILL = '#ece5d6';

export function heading(doc: PDFKit.PDFDocument, text: string): void {
  // Keep a heading with at least a few lines of what follows it.
  if (doc.y > doc.page.height - doc.page.margins.bottom - 90) doc.addPage();
  doc.moveDown(0.8).font('bold').fontSize(13).fillColor(INK).text(text, doc.page.margins.left, doc.y);
  doc.moveDown(0.25);
}

export function subheading(doc: PDFKit.PDFDocument, text: string): void {
  if (doc.y > doc.page.height - doc.page.margins.bottom - 60) doc.addPage();
  doc.moveDown(0.4).font('bold').fontSize(10.5).fillColor(INK).text(text, doc.page.margins.left, doc.y);
  doc.moveDown(0.15);
}

export function paragraph(doc: PDFKit.PDFDocument, text: string, opts: { muted?: boolean; italic?: boolean } = {}): void {
  doc.font(opts.italic ? 'italic' : 'regular').fontSize(9.5).fillColor(opts.muted ? MUTED : INK)
    .text(text, doc.page.margins.left, doc.y, { width: contentWidth(doc) });
  doc.fillColor(INK);
}

export const contentWidth = (doc: PDFKit.PDFDocument) => doc.page.width - doc.page.margins.left - doc.page.margins.right;

/** Label–value pairs in two columns of pairs, no rules (the case's facts). */
export function facts(doc: PDFKit.PDFDocument, pairs: [string, string][]): void {
  const rows: PDFKit.Mixins.CellOptions[][] = [];
  for (let i = 0; i < pairs.length; i += 2) {
    const cell = (p: [string, string] | undefined): PDFKit.Mixins.CellOptions[] => (p
      ? [{ text: p[0], font: { src: 'bold' }, textColor: MUTED }, { text: p[1] }]
      : [{ text: '' }, { text: '' }]);
    rows.push([...cell(pairs[i]), ...cell(pairs[i + 1])]);
  }
  doc.font('regular').fontSize(9.5).fillColor(INK);
  doc.table({ columnStyles: [90, '*', 90, '*'], defaultStyle: { border: 0, padding: [1.5, 4, 1.5, 0] }, data: rows });
  doc.x = doc.page.margins.left;
}

/** A ruled table with a shaded header row; `widths` as pdfkit takes them (points, or '*' to share the rest). */
export function table(doc: PDFKit.PDFDocument, header: string[], rows: string[][], widths: (number | string)[], opts: { emptyText?: string } = {}): void {
  if (rows.length === 0) { paragraph(doc, opts.emptyText ?? 'None recorded.', { muted: true }); return; }
  // Start a table on a new page rather than leave its header row alone at the foot.
  if (doc.y > doc.page.height - doc.page.margins.bottom - 50) doc.addPage();
  doc.font('regular').fontSize(8.5).fillColor(INK);
  doc.table({
    columnStyles: widths,
    defaultStyle: { border: 0.5, borderColor: RULE, padding: [2.5, 3] },
    rowStyles: (i) => (i === 0 ? { backgroundColor: HEAD_FILL, font: { src: 'bold' } } as PDFKit.Mixins.RowStyle : undefined),
    data: [header.map((h) => ({ text: h, font: { src: 'bold' } })), ...rows],
  });
  doc.x = doc.page.margins.left;
  doc.moveDown(0.3);
}
