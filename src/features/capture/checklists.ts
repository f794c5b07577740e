/**
 * The two room checks. Items follow the spirit of the WHO Surgical Safety Checklist (World Health
 * Organization, 2009: "sign in / time out / sign out"), adapted to an endoscopy room as PRODUCT.md lists
 * them; the wording is ours. Each answer is yes, no or not applicable; a "no" is recorded as said, never
 * blocked: the team decides, the record shows.
 */
export type CheckAnswer = 'yes' | 'no' | 'not_applicable';
export interface CheckItem { key: string; label: string }

export const timeOutItems: CheckItem[] = [
  { key: 'patient_identity', label: 'Patient identity confirmed by two identifiers (name and date of birth or hospital number)' },
  { key: 'procedure_site', label: 'Procedure and lesion site agreed by the team' },
  { key: 'consent', label: 'Consent signed and matches the procedure' },
  { key: 'allergies', label: 'Allergies checked' },
  { key: 'anticoagulants_held', label: 'Anticoagulants and antiplatelets held as planned' },
  { key: 'equipment_esu', label: 'Equipment and electrosurgical unit checked' },
  { key: 'co2_insufflation', label: 'CO₂ insufflation connected' },
  { key: 'specimen_plan', label: 'Specimen plan agreed (retrieval, pinning, container)' },
];

export const signOutItems: CheckItem[] = [
  { key: 'specimens_labelled', label: 'Specimens labelled and matched to the patient' },
  { key: 'device_counts_reconciled', label: 'Device counts reconciled (opened = deployed + misfired + wasted)' },
  { key: 'equipment_problems', label: 'Equipment problems to report' },
  { key: 'handover', label: 'Handover to recovery given' },
];

export const answerLabels: Record<CheckAnswer, string> = { yes: 'Yes', no: 'No', not_applicable: 'N/A' };

export interface CheckAnswers { [key: string]: { answer?: CheckAnswer; note?: string } }

/** The `items` of a time_out / sign_out payload: answered items only, with their label for the record. */
export function toCheckPayloadItems(items: CheckItem[], answers: CheckAnswers) {
  return items.flatMap((it) => {
    const a = answers[it.key];
    if (!a?.answer) return [];
    const note = a.note?.trim();
    return [{ key: it.key, label: it.label, answer: a.answer, ...(note ? { note } : {}) }];
  });
}

export const allAnswered = (items: CheckItem[], answers: CheckAnswers) => items.every((it) => answers[it.key]?.answer);
