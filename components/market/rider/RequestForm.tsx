'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { Controller, FormProvider, useFieldArray, useForm, useWatch, type FieldPath } from 'react-hook-form';
import { Button } from '@/components/ui/Button';
import { SelectField, TextField } from '@/components/ui/Field';
import { Notice } from '@/components/ui/Notice';
import { formatCents } from '@/lib/format';
import { BB_SHELL_TYPES, requestInputSchema, type FrameSpec, type RequestFormValues, type WheelSpec } from '@/lib/market/schema';
import { LiveFitPanel } from './LiveFitPanel';
import { WheelFields } from './WheelFields';

const STEPS = ['Wheels', 'Frame', 'Where, when and budget', 'Review'] as const;

const defaultWheel = (position: 'front' | 'rear'): WheelSpec => ({
  position,
  nominalDiameterIn: 26,
  rimWidthMm: 80,
  tireWidthMm: 76,
  spokes: 72,
  spokeGauge: 12,
  lacing: { kind: 'cross', crosses: 3 },
  hubId: position === 'rear' ? 'rear-igh3-coaster-120' : 'front-100',
  finish: 'polished',
});

function inDays(days: number): string {
  return new Date(Date.now() + days * 86_400_000).toISOString().slice(0, 10);
}

export const NEW_REQUEST_DEFAULTS: RequestFormValues = {
  title: '',
  wheels: [defaultWheel('rear')],
  frame: { rearSpacingMm: 120, frontSpacingMm: 100, bbShellWidthMm: 69.85, bbShellType: 'one-piece', chainstayLengthMm: 460 },
  zip: '',
  delivery: 'ship',
  neededBy: inDays(45),
  budgetCents: 60000,
  notes: '',
};

// Which fields each step checks before moving on.
const STEP_FIELDS: FieldPath<RequestFormValues>[][] = [['wheels'], ['frame'], ['title', 'zip', 'delivery', 'neededBy', 'budgetCents', 'notes'], []];

type Mode = { kind: 'create' } | { kind: 'edit'; requestId: string };

export function RequestForm({ initial = NEW_REQUEST_DEFAULTS, mode = { kind: 'create' } }: { initial?: RequestFormValues; mode?: Mode }) {
  const router = useRouter();
  const [step, setStep] = useState(0);
  const [failure, setFailure] = useState<string | null>(null);
  const form = useForm<RequestFormValues>({ resolver: zodResolver(requestInputSchema), defaultValues: initial, mode: 'onTouched' });
  const { register, control, formState } = form;
  const wheels = useFieldArray({ control, name: 'wheels' });
  const values = useWatch({ control }) as RequestFormValues;
  const errors = formState.errors;
  const positions = (values.wheels ?? []).map((w) => w.position);
  const wheelSet = positions.length === 2 ? 'pair' : positions[0];

  function chooseWheels(choice: 'rear' | 'front' | 'pair') {
    const wanted: ('front' | 'rear')[] = choice === 'pair' ? ['front', 'rear'] : [choice];
    const current = form.getValues('wheels');
    wheels.replace(wanted.map((p) => current.find((w) => w.position === p) ?? defaultWheel(p)));
  }

  async function next() {
    const ok = await form.trigger(STEP_FIELDS[step]);
    if (ok) setStep((s) => Math.min(s + 1, STEPS.length - 1));
  }

  async function save(publish: boolean) {
    setFailure(null);
    const valid = await form.trigger();
    if (!valid) {
      setFailure('Some fields need attention; the steps with problems are marked.');
      return;
    }
    const body = requestInputSchema.parse(form.getValues());
    const res =
      mode.kind === 'create'
        ? await fetch('/api/requests', { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ ...body, publish }) })
        : await fetch(`/api/requests/${mode.requestId}`, { method: 'PATCH', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });
    const answer = await res.json().catch(() => ({}));
    if (!res.ok) {
      for (const [field, messages] of Object.entries((answer.fieldErrors ?? {}) as Record<string, string[]>)) {
        form.setError(field as FieldPath<RequestFormValues>, { message: messages[0] });
      }
      setFailure(answer.error ?? 'We could not save the request. Your answers are still here; try again.');
      return;
    }
    const id = mode.kind === 'create' ? answer.id : mode.requestId;
    if (mode.kind === 'edit' && publish) {
      const published = await fetch(`/api/requests/${id}/publish`, { method: 'POST' });
      if (!published.ok) {
        setFailure(((await published.json().catch(() => ({}))) as { error?: string }).error ?? 'Saved, but not published.');
        return;
      }
    }
    router.push(`/requests/${id}`);
    router.refresh();
  }

  const stepHasError = (i: number) => STEP_FIELDS[i].some((f) => f.split('.').reduce<unknown>((e, k) => (e as Record<string, unknown> | undefined)?.[k], errors));

  return (
    <FormProvider {...form}>
      <div className="grid gap-6 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
        <form onSubmit={(e) => e.preventDefault()} noValidate className="space-y-5" aria-label="Wheel request">
          <ol className="flex flex-wrap gap-2 text-sm" aria-label="Steps">
            {STEPS.map((label, i) => (
              <li key={label}>
                <button
                  type="button"
                  onClick={() => setStep(i)}
                  aria-current={step === i ? 'step' : undefined}
                  className={`rounded-full px-3 py-1 font-semibold ${step === i ? 'bg-petrol-600 text-white' : stepHasError(i) ? 'bg-rust-50 text-rust-700' : 'bg-chalk-100 text-ink-700'}`}
                >
                  {i + 1}. {label}
                </button>
              </li>
            ))}
          </ol>
          {failure && <Notice tone="danger">{failure}</Notice>}

          {step === 0 && (
            <div className="space-y-4">
              <div role="radiogroup" aria-label="Which wheels" className="flex flex-wrap gap-2">
                {(['rear', 'front', 'pair'] as const).map((choice) => (
                  <button
                    key={choice}
                    type="button"
                    role="radio"
                    aria-checked={wheelSet === choice}
                    onClick={() => chooseWheels(choice)}
                    className={`rounded border px-3 py-1.5 text-sm font-semibold ${wheelSet === choice ? 'border-petrol-500 bg-petrol-50 text-petrol-700' : 'border-chalk-300 bg-white text-ink-700'}`}
                  >
                    {choice === 'pair' ? 'Front and rear pair' : choice === 'rear' ? 'Rear wheel only' : 'Front wheel only'}
                  </button>
                ))}
              </div>
              {wheels.fields.map((field, i) => (
                <WheelFields key={field.id} index={i} />
              ))}
            </div>
          )}

          {step === 1 && (
            <fieldset className="space-y-3 rounded-lg border border-chalk-200 bg-white p-4">
              <legend className="px-1 font-display text-lg font-bold">Frame</legend>
              <div className="grid gap-3 sm:grid-cols-2">
                <TextField label="Rear dropout spacing (mm)" type="number" error={errors.frame?.rearSpacingMm?.message} {...register('frame.rearSpacingMm', { valueAsNumber: true })} />
                <TextField label="Fork spacing (mm)" type="number" error={errors.frame?.frontSpacingMm?.message} {...register('frame.frontSpacingMm', { valueAsNumber: true })} />
                <TextField label="Bottom-bracket shell width (mm)" type="number" step={0.01} hint="2¾ inch is 69.85 mm." error={errors.frame?.bbShellWidthMm?.message} {...register('frame.bbShellWidthMm', { valueAsNumber: true })} />
                <SelectField label="Bottom-bracket shell type" error={errors.frame?.bbShellType?.message} {...register('frame.bbShellType')}>
                  {BB_SHELL_TYPES.map((t) => (
                    <option key={t} value={t}>
                      {t === 'one-piece' ? 'Unthreaded, for a one-piece crank' : t === 'threaded' ? 'Threaded' : 'Press-fit'}
                    </option>
                  ))}
                </SelectField>
                <TextField
                  label="Chainstay length (mm, optional)"
                  type="number"
                  error={errors.frame?.chainstayLengthMm?.message}
                  {...register('frame.chainstayLengthMm', { setValueAs: (v) => (v === '' || v === undefined || Number.isNaN(Number(v)) ? undefined : Number(v)) })}
                />
              </div>
              <Notice tone="caution">Spreading or narrowing a frame to fit a hub (cold-setting) is work for a qualified frame builder, under local practice.</Notice>
            </fieldset>
          )}

          {step === 2 && (
            <fieldset className="space-y-3 rounded-lg border border-chalk-200 bg-white p-4">
              <legend className="px-1 font-display text-lg font-bold">Where, when and budget</legend>
              <TextField label="Title" placeholder="e.g. 26-inch 4-inch rear for my cruiser" error={errors.title?.message} {...register('title')} />
              <div className="grid gap-3 sm:grid-cols-2">
                <TextField label="Your ZIP code" inputMode="numeric" error={errors.zip?.message} {...register('zip')} />
                <SelectField label="Delivery" error={errors.delivery?.message} {...register('delivery')}>
                  <option value="ship">Ship it to me</option>
                  <option value="pickup">I will pick it up</option>
                </SelectField>
                <TextField label="Needed by" type="date" error={errors.neededBy?.message} {...register('neededBy')} />
                <Controller
                  control={control}
                  name="budgetCents"
                  render={({ field, fieldState }) => (
                    <TextField
                      label="Budget (US dollars)"
                      type="number"
                      step={1}
                      min={1}
                      value={typeof field.value === 'number' && !Number.isNaN(field.value) ? String(field.value / 100) : ''}
                      onChange={(e) => field.onChange(e.target.value === '' ? undefined : Math.round(Number(e.target.value) * 100))}
                      onBlur={field.onBlur}
                      error={fieldState.error?.message}
                    />
                  )}
                />
              </div>
              <label className="block text-sm font-semibold text-ink-700" htmlFor="notes">
                Notes for builders
              </label>
              <textarea id="notes" rows={4} className="block w-full rounded border border-chalk-300 bg-white px-3 py-2" {...register('notes')} />
              {errors.notes?.message && <p className="text-xs font-semibold text-rust-700">{errors.notes.message}</p>}
            </fieldset>
          )}

          {step === 3 && (
            <div className="space-y-3 rounded-lg border border-chalk-200 bg-white p-4 text-sm">
              <h2 className="font-display text-lg font-bold">Review</h2>
              <p>
                <strong>{values.title || 'Untitled request'}</strong> · {positions.join(' and ')} · ZIP {values.zip || '—'} · {values.delivery === 'pickup' ? 'local pickup' : 'shipped'} · needed by{' '}
                {values.neededBy} · budget {values.budgetCents ? formatCents(values.budgetCents) : '—'}
              </p>
              <p className="text-ink-500">Builders see this request and bid with a price and a lead time. You can edit it until the first bid arrives.</p>
            </div>
          )}

          <div className="flex flex-wrap gap-3">
            {step > 0 && (
              <Button type="button" tone="quiet" onClick={() => setStep(step - 1)}>
                Back
              </Button>
            )}
            {step < STEPS.length - 1 && (
              <Button type="button" onClick={next}>
                Next
              </Button>
            )}
            <Button type="button" tone="secondary" onClick={() => save(false)}>
              Save as draft
            </Button>
            {step === STEPS.length - 1 && (
              <Button type="button" onClick={() => save(true)}>
                Publish to builders
              </Button>
            )}
          </div>
        </form>
        <aside aria-label="Live fit" className="lg:sticky lg:top-4 lg:self-start">
          <h2 className="mb-2 font-display text-lg font-bold">Fit and baseline, as you type</h2>
          <LiveFitPanel wheels={(values.wheels ?? []) as WheelSpec[]} frame={values.frame as FrameSpec} />
        </aside>
      </div>
    </FormProvider>
  );
}
