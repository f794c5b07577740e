import { useState } from 'react';
import { FormProvider, useForm } from 'react-hook-form';
import { useNavigate } from 'react-router';
import { v7 as uuidv7 } from 'uuid';
import type { CaseSummary, Member, Room, ScheduleCaseInput } from '#shared/schemas/cases.ts';
import { Banner } from '@/components/ui/banner.tsx';
import { Button } from '@/components/ui/button.tsx';
import { errorMessage } from '@/lib/api.ts';
import { applyServerErrors } from '@/lib/form-errors.ts';
import { useScheduleCase } from '../../api/schedule-case.ts';
import { scheduleFieldPaths, scheduleResolver, type ScheduleFormValues } from './model.ts';
import { PatientSection } from './patient-section.tsx';
import { ProcedureSection } from './procedure-section.tsx';
import { TeamSection } from './team-section.tsx';

type Props = {
  defaults: ScheduleFormValues;
  rooms: Room[];
  endoscopists: Member[];
  nurses: Member[];
  /** Called with the new case; by default the case page opens. */
  onScheduled?: (created: CaseSummary) => void;
};

/**
 * The schedule form. Checked on the tablet by the same scheduleCaseSchema the server uses; field
 * issues in a 400 answer land on the same fields.
 */
export function ScheduleForm({ defaults, rooms, endoscopists, nurses, onScheduled }: Props) {
  const navigate = useNavigate();
  const schedule = useScheduleCase();
  const [leftover, setLeftover] = useState<string[]>([]);
  // The case's id, made once per form: sending again after an answer was lost (a network drop, a second
  // press) is answered with the case the first send made, never a second case (scheduleCaseSchema.id).
  const [caseId] = useState(() => uuidv7());
  const form = useForm<ScheduleFormValues, unknown, ScheduleCaseInput>({
    resolver: scheduleResolver,
    defaultValues: defaults,
    shouldFocusError: true,
  });
  const errorCount = Object.keys(form.formState.errors).length;

  const onSubmit = form.handleSubmit((input) => {
    setLeftover([]);
    schedule.mutate({ ...input, id: caseId }, {
      onSuccess: (created) => (onScheduled ? onScheduled(created) : navigate(`/cases/${created.id}`)),
      onError: (err) => setLeftover(applyServerErrors(err, form.setError, scheduleFieldPaths)),
    });
  });

  const serverFieldsOnly = schedule.error && leftover.length === 0 && errorCount > 0;
  return (
    <FormProvider {...form}>
      <form onSubmit={onSubmit} noValidate className="flex flex-col gap-6" aria-label="Schedule a case">
        {form.formState.isSubmitted && errorCount > 0 && (
          <Banner tone="danger" title="Check the marked fields">Each one says what to change.</Banner>
        )}
        {schedule.error && !serverFieldsOnly && (
          <Banner tone="danger" title="The case was not scheduled">
            {leftover.length > 0 ? <ul className="list-disc pl-5">{leftover.map((m) => <li key={m}>{m}</li>)}</ul> : errorMessage(schedule.error)}
          </Banner>
        )}
        <PatientSection />
        <ProcedureSection />
        <TeamSection rooms={rooms} endoscopists={endoscopists} nurses={nurses} />
        <div className="flex flex-wrap gap-4">
          <Button type="submit" variant="primary" size="lg" busy={schedule.isPending} className="min-w-64">Schedule the case</Button>
          <Button size="lg" onClick={() => navigate(-1)}>Back</Button>
        </div>
      </form>
    </FormProvider>
  );
}
