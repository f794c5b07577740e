import { Link } from 'react-router';
import type { CaseSummary } from '#shared/schemas/cases.ts';
import { patientName, shortProcedure, timeOf } from './format.ts';
import { StatusBadge } from './status-badge.tsx';

export function CaseCard({ c }: { c: CaseSummary }) {
  return (
    <li>
      <Link
        to={`/cases/${c.id}`}
        className="flex gap-4 rounded-card border-2 border-line bg-surface p-4 text-text no-underline shadow-card hover:border-line-strong"
        aria-label={`${timeOf(c.scheduledAt)}, ${patientName(c.patient)}, ${shortProcedure(c.procedureType)}`}
      >
        <span className="w-16 shrink-0 text-2xl font-bold tabular-nums">{timeOf(c.scheduledAt)}</span>
        <span className="flex min-w-0 flex-1 flex-col gap-1">
          <span className="text-lg font-bold break-words">{patientName(c.patient)}</span>
          <span className="font-mono text-base break-all text-muted">{c.patient.hospitalNumber}</span>
          <span>
            <strong>{shortProcedure(c.procedureType)}</strong> · {c.lesion.site}, {c.lesion.sizeMm} mm
          </span>
          <span className="text-sm text-muted">{c.endoscopist.name} · {c.nurse.name}</span>
          <StatusBadge status={c.status} className="mt-1 self-start" />
        </span>
      </Link>
    </li>
  );
}
