import type { CaseSummary } from '#shared/schemas/cases.ts';
import { birthLine, patientName, sexWords } from './format.ts';

/** Who the case is for, in large type: the two identifiers a time-out checks (name, hospital number) and the date of birth. */
export function PatientBanner({ patient }: { patient: CaseSummary['patient'] }) {
  return (
    <section aria-label="Patient" data-region="patient" className="rounded-card border-2 border-primary bg-surface p-4 shadow-card sm:p-5">
      <p className="text-3xl font-bold" data-testid="patient-name">{patientName(patient)}</p>
      <dl className="mt-2 flex flex-wrap gap-x-8 gap-y-1 text-lg">
        <div className="flex gap-2"><dt className="text-muted">Hospital no.</dt><dd className="font-mono font-bold tracking-wide">{patient.hospitalNumber}</dd></div>
        <div className="flex gap-2"><dt className="text-muted">Born</dt><dd className="font-bold">{birthLine(patient.birthDate)}</dd></div>
        <div className="flex gap-2"><dt className="sr-only">Sex</dt><dd>{sexWords[patient.sex]}</dd></div>
      </dl>
    </section>
  );
}
