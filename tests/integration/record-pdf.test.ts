import { execFileSync } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { auditLog, patients } from '#server/db/schema/index.ts';
import { formatArea, formatMinutes, formatSeconds, recordViewSchema, RECORD_CAUTION, type RecordView } from '#shared/schemas/record.ts';
import { createTestContext, type TestContext } from './helpers/app.ts';
import { api, binary, buildWard, recordScenario, type Ward } from './record-fixtures.ts';

/**
 * The PDF is read back the way a person's PDF reader reads it: Poppler's `pdftotext` (Debian package
 * poppler-utils) extracts the text through each font's ToUnicode map, so what is checked here is the text
 * a reader shows, with its accents, not the drawing operators pdfkit wrote (which, with an embedded
 * TrueType subset, hold glyph numbers rather than letters).
 */
const pdfText = (pdf: Buffer) => execFileSync('pdftotext', ['-layout', '-enc', 'UTF-8', '-', '-'], { input: pdf }).toString('utf8');
// pdftotext's layout mode pads columns with runs of spaces; one space is enough to compare.
const squeeze = (s: string) => s.replace(/[ \t]+/g, ' ');

let t: TestContext;
let w: Ward;
let s: Awaited<ReturnType<typeof recordScenario>>;
let view: RecordView;
let pdf: Buffer;
let text: string;

beforeAll(async () => {
  t = await createTestContext();
  w = await buildWard(t);
  s = await recordScenario(t, w);
  // Accented letters, as patients' names carry them (the reason for the TrueType font: STACK.md, PDF fonts).
  await t.db.update(patients).set({ givenName: 'Zoë Ørsted' }).where(eq(patients.id, s.caseRow.patientId));
  view = recordViewSchema.parse((await api(t, w.cookies.nurse).get(`/api/cases/${s.caseRow.id}/record`)).body);
  const res = await binary(t, w.cookies.nurse, `/api/cases/${s.caseRow.id}/record.pdf`);
  expect(res.status).toBe(200);
  expect(res.headers['content-type']).toBe('application/pdf');
  pdf = res.body as Buffer;
  text = squeeze(pdfText(pdf));
});
afterAll(() => t.close());

describe('the record as PDF', () => {
  it('is a PDF with the patient and case details, accents intact', () => {
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    expect(text).toContain(`${view.patient.familyName.toUpperCase()}, Zoë Ørsted`);
    expect(text).toContain(view.patient.hospitalNumber);
    expect(text).toContain('ESD — endoscopic submucosal'); // the cell wraps before "dissection"
    expect(text).toContain(w.members.endoscopist.name);
  });

  it('carries the caution and the patient\'s identifiers at the foot of every page', () => {
    const pages = pdfText(pdf).split('\f').filter((p) => p.trim().length > 0).map(squeeze);
    expect(pages.length).toBeGreaterThan(1);
    const firstWords = RECORD_CAUTION.split(' ').slice(0, 8).join(' ');
    for (const [i, page] of pages.entries()) {
      expect(page).toContain(firstWords);
      expect(page).toContain(`Hospital no. ${view.patient.hospitalNumber}`);
      expect(page).toContain(`Page ${i + 1} of ${pages.length}`);
    }
  });

  it('shows the same counts, durations, bleed and specimen figures as the record page', () => {
    expect(text).toMatch(new RegExp(`Clips deployed ${view.counts.clipsDeployed}\\b`));
    expect(text).toMatch(new RegExp(`Clips misfired ${view.counts.clipsMisfired}\\b`));
    expect(text).toMatch(new RegExp(`Loops placed ${view.counts.loopsPlaced}\\b`));
    for (const phase of view.phases) expect(text).toContain(formatMinutes(phase.minutes));
    // 270 s from bleed to haemostasis (record-view.test.ts) is written "4 min 30 s".
    expect(formatSeconds(view.bleeds[0]!.secondsToHaemostasis)).toBe('4 min 30 s');
    expect(text).toContain('4 min 30 s');
    expect(text).toContain(formatArea(view.specimens[0]!.areaMm2));
    for (const note of view.notes) expect(text).toContain(note.text.slice(0, 30));
  });

  it('lists the devices with their lots and expiry, and the voided tap\'s scan as voided', () => {
    expect(text).toContain('CLIPLOT-7 (2039-12-31)');
    expect(text).toMatch(/VOIDLOT.*Clip fired \(voided\)/);
  });

  it('gives the time-out answers, the timeline by phase and who recorded', () => {
    expect(text).toMatch(/Time-out: Done at 09:02:00 by /);
    expect(text).toMatch(/Anticoagulants held No Invented: aspirin continued/);
    for (const title of ['Before the scope went in', 'Resection', 'Retrieval', 'Closure', 'After the scope came out']) expect(text).toContain(title);
    expect(text).toMatch(/09:20:00 Bleed spurting, vessel 2 mm/);
    expect(text).toContain('Who recorded what and when');
    expect(text).toMatch(new RegExp(`${w.members.nurse.name} 21 09:00:00 10:02:00`));
  });

  it('writes the PDF view to the audit log too', async () => {
    const rows = await t.db.select().from(auditLog).where(eq(auditLog.entityId, s.caseRow.id));
    expect(rows.some((r) => r.action === 'record.view' && (r.detail as { format?: string }).format === 'pdf' && r.userId === w.members.nurse.id)).toBe(true);
  });
});
