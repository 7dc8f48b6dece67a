import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { toast } from '@client/lib/toast';
import type { z } from 'zod';
import { findOperation } from '@shared/catalogue';
import type { MilestoneInput, milestoneInputSchema } from '@shared/schemas/inspection';
import { milestoneKinds } from '@shared/schemas/values';
import type { JobDetail } from '@shared/schemas/jobs';
import { Button } from '@client/components/ui/button';
import { Notice } from '@client/components/ui/notice';
import { SelectField } from '@client/components/ui/select-field';
import { TextAreaField } from '@client/components/ui/text-area-field';
import { TextField } from '@client/components/ui/text-field';
import { applyServerErrors } from '@client/lib/form-errors';
import { useLogMilestone } from '../api/milestones';
import { MilestonePhotoPicker, type PendingPhoto } from './milestone-photo-picker';
import { milestoneKindWords } from './milestone-words';
import { lazyResolver } from '@client/lib/lazy-resolver';

const milestoneInputResolver = lazyResolver(() => import('@shared/schemas/inspection').then((m) => m.milestoneInputSchema));

type FormValues = z.input<typeof milestoneInputSchema>;
type Kind = (typeof milestoneKinds)[number];

/** Before the parts arrive there is only one thing to log; afterwards, everything else the shop logs. */
function kindsFor(status: JobDetail['status']): Kind[] {
  if (status === 'funded') return ['block_received'];
  return milestoneKinds.filter((kind) => kind !== 'block_received' && kind !== 'inspection_submitted' && kind !== 'sent_to_shop');
}

const NOTE_LABELS: Partial<Record<Kind, string>> = {
  teardown: 'What you found',
  note: 'Note',
};

/** The awarded shop says what happened; the builder sees it on the timeline at once. */
export function LogProgressForm({ job }: { job: JobDetail }) {
  const [formError, setFormError] = useState<string>();
  const [photos, setPhotos] = useState<PendingPhoto[]>([]);
  const [photoError, setPhotoError] = useState<string>();
  const kinds = kindsFor(job.status);
  const defaults: FormValues = { kind: (job.status === 'funded' ? 'block_received' : '') as Kind, operation: '', note: '', carrier: '', trackingNumber: '' };
  const form = useForm<FormValues, unknown, MilestoneInput>({ resolver: milestoneInputResolver, defaultValues: defaults });
  const kind = form.watch('kind') as Kind | '';
  const log = useLogMilestone(job.id, {
    mutationConfig: {
      onSuccess: (milestone) => {
        toast.success(`Logged: ${milestoneKindWords[milestone.kind].toLowerCase()}. The builder can see it.`);
        form.reset({ ...defaults, kind: '' as Kind });
        setPhotos([]);
        setPhotoError(undefined);
      },
    },
  });
  const errors = form.formState.errors;
  const withOperation = kind === 'operation_started' || kind === 'operation_finished';

  const onSubmit = form.handleSubmit((values) => {
    setFormError(undefined);
    setPhotoError(undefined);
    if (photos.some((p) => p.status === 'uploading')) {
      setPhotoError('Wait for the photos to finish uploading, then log it.');
      return;
    }
    const photoIds = photos.filter((p) => p.status === 'done' && p.photo).map((p) => p.photo!.id);
    // Only the fields that belong to the chosen kind are sent.
    const input: MilestoneInput = {
      kind: values.kind,
      note: values.note,
      ...(withOperation ? { operation: values.operation } : {}),
      ...(values.kind === 'shipped' ? { carrier: values.carrier, trackingNumber: values.trackingNumber } : {}),
      ...(photoIds.length ? { photoIds } : {}),
    };
    log.mutate(input, {
      onError: (error) => {
        if (error.fields?.photoIds) setPhotoError(error.fields.photoIds);
        setFormError(applyServerErrors(error, form.setError, ['kind', 'operation', 'note', 'carrier', 'trackingNumber', 'photoIds']));
      },
    });
  });

  return (
    <form onSubmit={onSubmit} noValidate aria-label="Log progress" className="flex flex-col gap-3 border-t border-slate-200 pt-4">
      <h3 className="text-lg font-bold">Log progress</h3>
      {formError && <Notice tone="error">{formError}</Notice>}
      <SelectField
        label="What happened"
        error={errors.kind?.message}
        options={[{ value: '', label: 'Choose …' }, ...kinds.map((value) => ({ value, label: milestoneKindWords[value] }))]}
        {...form.register('kind')}
      />
      {job.status === 'funded' && kind === 'block_received' && (
        <p className="text-sm text-ink-soft">Logging the block as received tells the builder the work has started; the job moves to “In the shop”.</p>
      )}
      {withOperation && (
        <SelectField
          label="Operation"
          error={errors.operation?.message}
          options={[
            { value: '', label: 'Choose …' },
            ...job.spec.operations.map((op) => ({ value: op.code, label: findOperation(op.code)?.name ?? op.code })),
          ]}
          {...form.register('operation')}
        />
      )}
      {kind === 'shipped' && (
        <div className="grid gap-3 sm:grid-cols-2">
          <TextField label="Carrier" autoComplete="off" error={errors.carrier?.message} {...form.register('carrier')} />
          <TextField label="Tracking number" autoComplete="off" error={errors.trackingNumber?.message} {...form.register('trackingNumber')} />
        </div>
      )}
      <TextAreaField
        label={NOTE_LABELS[kind as Kind] ?? 'Note (optional)'}
        rows={3}
        error={errors.note?.message}
        {...form.register('note')}
      />
      <MilestonePhotoPicker jobId={job.id} photos={photos} onChange={setPhotos} error={photoError} />
      <div>
        <Button type="submit" busy={log.isPending}>
          Log it
        </Button>
      </div>
    </form>
  );
}
