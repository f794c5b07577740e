import bwipjs from 'bwip-js/node';
import PDFDocument from 'pdfkit';
import { collectPdf, registerPdfFonts } from './pdf.ts';

/**
 * Specimen container labels: a barcode carrying the specimen id, and the text a pathology bench reads
 * beside it. Two identifiers of the patient (name and hospital number, with date of birth) on every
 * container follow common practice for specimen labelling; local policy decides the final layout.
 */
export const labelSymbologies = ['datamatrix', 'code128'] as const;
export type LabelSymbology = (typeof labelSymbologies)[number];

export interface SpecimenLabelInput {
  specimenId: string;
  /** The team's name for the specimen ("A", "A — fundus lesion"). */
  label: string;
  patient: { familyName: string; givenName: string; hospitalNumber: string; birthDate: string };
  /** ISO date-time the specimen came out (or the case date when it was never recorded). */
  collectedAt: string;
  procedure: string;
  containerId: string | null;
}

/**
 * The barcode alone, as PNG. A UUID is 36 characters: as DataMatrix it fits a 22×22 mm square at this
 * scale, as Code 128 it is about 400 modules wide, so Code 128 is offered for scanners that read only
 * linear symbols and DataMatrix is the label's default.
 */
export async function barcodePng(text: string, symbology: LabelSymbology, scale = 4): Promise<Buffer> {
  const common = { text, scale, backgroundcolor: 'FFFFFF' };
  return symbology === 'datamatrix'
    ? bwipjs.toBuffer({ ...common, bcid: 'datamatrix' })
    : bwipjs.toBuffer({ ...common, bcid: 'code128', height: 12, includetext: false });
}

/** Label size in PDF points (1 pt = 1/72 in): 76 × 51 mm, a common container label (common practice). */
const MM = 72 / 25.4;
export const LABEL_SIZE_PT: [number, number] = [76 * MM, 51 * MM];

/** One label as a one-page PDF sized to the label, ready for a label printer's driver. */
export async function specimenLabelPdf(input: SpecimenLabelInput, symbology: LabelSymbology = 'datamatrix'): Promise<Buffer> {
  const png = await barcodePng(input.specimenId, symbology, symbology === 'datamatrix' ? 6 : 3);
  // No bottom margin: the id line sits at the foot, where pdfkit would otherwise open a second page.
  const doc = new PDFDocument({
    size: LABEL_SIZE_PT,
    margins: { top: 3 * MM, left: 3 * MM, right: 3 * MM, bottom: 0 },
    info: { Title: `Specimen ${input.label}`, Creator: 'Ledgerline' },
  });
  registerPdfFonts(doc);
  const done = collectPdf(doc);
  const [w, h] = LABEL_SIZE_PT;
  const m = 3 * MM;
  const p = input.patient;

  doc.font('bold').fontSize(11).text(`${p.familyName.toUpperCase()}, ${p.givenName}`, m, m, { width: w - 2 * m, lineBreak: false, ellipsis: true });
  doc.font('regular').fontSize(8.5)
    .text(`Hospital no. ${p.hospitalNumber}   Born ${p.birthDate}`, { width: w - 2 * m, lineBreak: false })
    .moveDown(0.3);
  doc.font('bold').fontSize(13).text(`Specimen ${input.label}`, { width: w - 2 * m, lineBreak: false, ellipsis: true });
  doc.font('regular').fontSize(8)
    .text(input.procedure, { width: w - 2 * m, lineBreak: false, ellipsis: true })
    .text(`Collected ${input.collectedAt.slice(0, 16).replace('T', ' ')} UTC`, { width: w - 2 * m, lineBreak: false });
  if (input.containerId) doc.text(`Container ${input.containerId}`, { width: w - 2 * m, lineBreak: false });

  if (symbology === 'datamatrix') {
    const side = 20 * MM;
    doc.image(png, w - m - side, h - m - side, { width: side, height: side });
    doc.fontSize(6).text(input.specimenId, m, h - m - 7, { width: w - 2 * m - side - 2 * MM, lineBreak: false });
  } else {
    const bw = w - 2 * m;
    doc.image(png, m, h - m - 14 * MM, { width: bw, height: 11 * MM });
    doc.fontSize(6).text(input.specimenId, m, h - m - 2.5 * MM, { width: bw, align: 'center', lineBreak: false });
  }
  doc.end();
  return done;
}
