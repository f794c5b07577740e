import { createRequire } from 'node:module';
import PDFDocument from 'pdfkit';

/**
 * PDF output with pdfkit. Text is set in Atkinson Hyperlegible from its TrueType files: pdfkit cannot
 * read WOFF2 with non-ASCII text, and the web font's Latin subset lacks the accented letters that
 * patients' and staff names carry (STACK.md, PDF fonts). pdfkit embeds a subset of each font.
 */
const require = createRequire(import.meta.url);
const fontDir = (weight: string) => `@expo-google-fonts/atkinson-hyperlegible/${weight}/AtkinsonHyperlegible_${weight}.ttf`;
export const pdfFontFiles = {
  regular: require.resolve(fontDir('400Regular')),
  bold: require.resolve(fontDir('700Bold')),
  italic: require.resolve(fontDir('400Regular_Italic')),
} as const;
export type PdfFont = keyof typeof pdfFontFiles;

export function registerPdfFonts(doc: PDFKit.PDFDocument): void {
  for (const [name, file] of Object.entries(pdfFontFiles)) doc.registerFont(name, file);
  doc.font('regular');
}

/** The finished file as one Buffer (resolves after `doc.end()`). */
export function collectPdf(doc: PDFKit.PDFDocument): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = [];
    doc.on('data', (c: Buffer) => chunks.push(c));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
}

export interface PageDocumentOptions {
  title: string;
  /** Who made it, for the document information dictionary. */
  author?: string;
  /** Written at the foot of every page, above the page number (a caution, an identification line). */
  footer: (page: { index: number; count: number }) => string;
}

/** A4 portrait with 18 mm margins and room at the foot for the footer (common practice for chart documents). */
const MM = 72 / 25.4;
export const PAGE_MARGIN = 18 * MM;
const FOOTER_HEIGHT = 16 * MM;

/**
 * An A4 document whose pages are buffered, so `finishPages` can write each page's footer once the page
 * count is known. Content stays above the footer band because the bottom margin includes it.
 */
export function createPageDocument(opts: PageDocumentOptions): { doc: PDFKit.PDFDocument; done: Promise<Buffer>; finish: () => void } {
  const doc = new PDFDocument({
    size: 'A4',
    bufferPages: true,
    margins: { top: PAGE_MARGIN, left: PAGE_MARGIN, right: PAGE_MARGIN, bottom: PAGE_MARGIN + FOOTER_HEIGHT },
    info: { Title: opts.title, Author: opts.author ?? 'Ledgerline', Creator: 'Ledgerline' },
    lang: 'en-GB',
    displayTitle: true,
  });
  registerPdfFonts(doc);
  const done = collectPdf(doc);
  const finish = () => {
    const range = doc.bufferedPageRange();
    for (let i = range.start; i < range.start + range.count; i++) {
      doc.switchToPage(i);
      writeFooter(doc, opts.footer({ index: i - range.start, count: range.count }), `Page ${i - range.start + 1} of ${range.count}`);
    }
    doc.end();
  };
  return { doc, done, finish };
}

function writeFooter(doc: PDFKit.PDFDocument, text: string, pageLabel: string): void {
  // Writing inside the bottom margin would make pdfkit open a new page: lift the margin while we write.
  const bottom = doc.page.margins.bottom;
  doc.page.margins.bottom = 0;
  const width = doc.page.width - 2 * PAGE_MARGIN;
  const top = doc.page.height - PAGE_MARGIN - FOOTER_HEIGHT + 3 * MM;
  doc.save().moveTo(PAGE_MARGIN, top - 2 * MM).lineTo(PAGE_MARGIN + width, top - 2 * MM).lineWidth(0.5).strokeColor('#6f6857').stroke().restore();
  doc.font('italic').fontSize(7.5).fillColor('#3b4452').text(text, PAGE_MARGIN, top, { width, lineGap: 1 });
  doc.font('regular').fontSize(7.5).text(pageLabel, PAGE_MARGIN, doc.page.height - PAGE_MARGIN - 3 * MM, { width, align: 'right', lineBreak: false });
  doc.fillColor('black');
  doc.page.margins.bottom = bottom;
}
