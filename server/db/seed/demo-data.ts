// The invented demo unit (PRODUCT.md, Demo scenario). Every name, number and identifier here is made up.
import { readFileSync } from 'node:fs';
import { z } from 'zod';
import type { CatalogueItemType } from '../schema/catalogue.ts';
import type { ParisType, PatientInput, ProcedureType, SedationType } from '#shared/schemas/cases.ts';
import { roleSchema } from '#shared/schemas/common.ts';

export const demoUnit = {
  hospital: 'Kestrel Bay Hospital',
  name: 'Endoscopy Unit (level 3)',
  slug: 'kestrel-bay-endoscopy-l3',
  rooms: ['Room A', 'Room B', 'Room C'],
};

const demoUserSchema = z.array(z.object({ email: z.email(), name: z.string(), role: roleSchema, password: z.string().min(10) }));
/** One per role at least; demo-users.json is also what `npm start` prints. */
export const demoUsers = demoUserSchema.parse(JSON.parse(readFileSync(new URL('./demo-users.json', import.meta.url), 'utf8')));
export type DemoUser = (typeof demoUsers)[number];

/**
 * Generic device descriptions, no brand names. The GTINs are invented inside GS1's restricted-circulation
 * prefix range 020–029 (numbers for use within a company, never on traded items; from memory), with
 * valid check digits (GS1 General Specifications §7.9.1).
 */
export const demoCatalogue: { key?: 'clip' | 'loop' | 'otsc' | 'needle'; description: string; type: CatalogueItemType; sizeLabel: string | null; gtin: string | null; hibccLabeler?: string; hibccProduct?: string }[] = [
  { key: 'clip', description: 'Through-the-scope clip, 11 mm jaw', type: 'clip', sizeLabel: '11 mm', gtin: '00200044710075' },
  { description: 'Through-the-scope clip, rotatable, 16 mm jaw', type: 'clip', sizeLabel: '16 mm', gtin: '00200044710143' },
  { key: 'loop', description: 'Detachable nylon loop, 20 mm', type: 'loop', sizeLabel: '20 mm', gtin: '00200044710211' },
  { description: 'Detachable nylon loop, 30 mm', type: 'loop', sizeLabel: '30 mm', gtin: null, hibccLabeler: 'Z999', hibccProduct: 'NL30' },
  { key: 'otsc', description: 'Over-the-scope clip, 12 mm', type: 'over_the_scope_clip', sizeLabel: '12 mm', gtin: '00200044710280' },
  { description: 'Endoscopic suturing device', type: 'suturing_device', sizeLabel: null, gtin: '00200044710358' },
  { key: 'needle', description: 'Injection needle 25 G', type: 'injection_needle', sizeLabel: '25 G', gtin: '00200044710426' },
  { description: 'Dissection knife, needle type, 1.5 mm', type: 'knife', sizeLabel: '1.5 mm', gtin: '00200044710495' },
  { description: 'Dissection knife, insulated tip', type: 'knife', sizeLabel: null, gtin: '00200044710563' },
  { description: 'Resection snare, oval, 15 mm', type: 'snare', sizeLabel: '15 mm', gtin: '00200044710631' },
  { description: 'Retrieval net', type: 'net', sizeLabel: null, gtin: '00200044710709' },
  { description: 'Haemostatic coagulation forceps', type: 'other', sizeLabel: null, gtin: '00200044710778' },
];

export const demoPatients: PatientInput[] = [
  { hospitalNumber: 'KB-104233', familyName: 'Halloran', givenName: 'Maeve', birthDate: '1958-04-11', sex: 'female' },
  { hospitalNumber: 'KB-118907', familyName: 'Okafor', givenName: 'Tobias', birthDate: '1949-09-02', sex: 'male' },
  { hospitalNumber: 'KB-097514', familyName: 'Lindqvist', givenName: 'Greta', birthDate: '1963-12-19', sex: 'female' },
  { hospitalNumber: 'KB-121460', familyName: 'Moreau', givenName: 'Henri', birthDate: '1955-06-27', sex: 'male' },
  { hospitalNumber: 'KB-110382', familyName: 'Tanaka', givenName: 'Yuki', birthDate: '1971-02-08', sex: 'female' },
  { hospitalNumber: 'KB-125019', familyName: 'Brennan', givenName: 'Colm', birthDate: '1967-10-30', sex: 'male' },
];

export type DemoCase = {
  /** Which timeline the past case replays; absent for today's scheduled cases. */
  timeline?: 'eftr' | 'esd' | 'emr';
  patient: string; room: string; endoscopist: string; nurse: string;
  /** Days before today (0 = today) and local start time. */
  daysAgo: number; time: string;
  procedureType: ProcedureType; indication: string; sedation: SedationType;
  lesion: { site: string; sizeMm: number; paris: ParisType };
};

export const demoCases: DemoCase[] = [
  {
    timeline: 'eftr', patient: 'KB-104233', room: 'Room A', endoscopist: 'amara.osei@kestrelbay.example', nurse: 'sofia.marin@kestrelbay.example',
    daysAgo: 12, time: '09:10', procedureType: 'eftr', sedation: 'general_anaesthesia',
    indication: 'Submucosal tumour of the gastric fundus, growing on serial endoscopic ultrasound; full-thickness resection for histology',
    lesion: { site: 'gastric fundus', sizeMm: 28, paris: 'not_applicable' },
  },
  {
    timeline: 'esd', patient: 'KB-118907', room: 'Room B', endoscopist: 'lucas.brandt@kestrelbay.example', nurse: 'daniel.kaur@kestrelbay.example',
    daysAgo: 7, time: '13:30', procedureType: 'esd', sedation: 'deep',
    indication: 'Flat elevated lesion of the gastric antrum with a central depression; high-grade dysplasia on biopsy',
    lesion: { site: 'gastric antrum, greater curvature', sizeMm: 32, paris: '0-IIa+IIc' },
  },
  {
    timeline: 'emr', patient: 'KB-097514', room: 'Room A', endoscopist: 'amara.osei@kestrelbay.example', nurse: 'daniel.kaur@kestrelbay.example',
    daysAgo: 3, time: '10:00', procedureType: 'emr', sedation: 'moderate',
    indication: 'Granular laterally spreading lesion of the ascending colon found at surveillance colonoscopy',
    lesion: { site: 'ascending colon', sizeMm: 25, paris: '0-IIa' },
  },
  {
    patient: 'KB-121460', room: 'Room A', endoscopist: 'amara.osei@kestrelbay.example', nurse: 'sofia.marin@kestrelbay.example',
    daysAgo: 0, time: '08:30', procedureType: 'esd', sedation: 'deep',
    indication: 'Rectal laterally spreading lesion, non-granular, for en bloc resection',
    lesion: { site: 'rectum, posterior wall', sizeMm: 40, paris: '0-IIa' },
  },
  {
    patient: 'KB-110382', room: 'Room B', endoscopist: 'lucas.brandt@kestrelbay.example', nurse: 'daniel.kaur@kestrelbay.example',
    daysAgo: 0, time: '10:15', procedureType: 'emr', sedation: 'moderate',
    indication: 'Sessile polyp of the sigmoid colon referred after incomplete removal elsewhere',
    lesion: { site: 'sigmoid colon', sizeMm: 18, paris: '0-Is' },
  },
  {
    patient: 'KB-125019', room: 'Room C', endoscopist: 'amara.osei@kestrelbay.example', nurse: 'daniel.kaur@kestrelbay.example',
    daysAgo: 0, time: '13:00', procedureType: 'eftr', sedation: 'general_anaesthesia',
    indication: 'Subepithelial lesion of the gastric body on endoscopic ultrasound, for full-thickness resection',
    lesion: { site: 'gastric body, lesser curvature', sizeMm: 16, paris: 'not_applicable' },
  },
];
