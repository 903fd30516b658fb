'use client';

// A bid, new or revised: price as line items with a live total, lead time with the date it implies,
// how long it stands, a note to the rider and an optional change to the spec.
import { zodResolver } from '@hookform/resolvers/zod';
import { useId, useState } from 'react';
import { Controller, useForm, useWatch, type Control, type FieldPath } from 'react-hook-form';
import { Button } from '@/components/ui/Button';
import { SelectField, TextField } from '@/components/ui/Field';
import { Notice } from '@/components/ui/Notice';
import { formatCents } from '@/lib/format';
import type { RequestDetail } from '@/lib/market/getRequestForViewer';
import type { BidView } from '@/lib/market/rows';
import { bidInputSchema, type BidFormValues, type BidInput } from '@/lib/market/schema';
import { ApiError } from './fetchJson';
import { addDaysIso, daysBetween, formatDay, positionText, todayIso } from './display';

type LineName = 'partsCents' | 'labourCents' | 'finishCents' | 'shippingCents';
const LINES: { name: LineName; label: string; hint: string }[] = [
  { name: 'partsCents', label: 'Parts ($)', hint: 'Rims, hub, spokes, nipples, rim strip.' },
  { name: 'labourCents', label: 'Labour ($)', hint: 'Lacing, tensioning, truing, dishing.' },
  { name: 'finishCents', label: 'Finish ($)', hint: 'Polishing, paint or plating; 0 for none.' },
  { name: 'shippingCents', label: 'Shipping ($)', hint: 'Boxing and carriage; 0 for local pickup.' },
];

const centsToText = (cents: number | undefined): string =>
  cents === undefined || Number.isNaN(cents) ? '' : cents % 100 === 0 ? String(cents / 100) : (cents / 100).toFixed(2);

/** A dollar amount typed as text and held in the form as whole cents; the text is kept exactly as typed. */
function MoneyField({ control, name, label, hint }: { control: Control<BidFormValues>; name: LineName; label: string; hint: string }) {
  return (
    <Controller
      control={control}
      name={name}
      render={({ field, fieldState }) => <MoneyInput label={label} hint={hint} cents={field.value} onCents={field.onChange} onBlur={field.onBlur} inputRef={field.ref} error={fieldState.error} />}
    />
  );
}

function MoneyInput({
  label,
  hint,
  cents,
  onCents,
  onBlur,
  inputRef,
  error,
}: {
  label: string;
  hint: string;
  cents: number | undefined;
  onCents: (cents: number | undefined) => void;
  onBlur: () => void;
  inputRef: React.Ref<HTMLInputElement>;
  error?: { message?: string; type?: string };
}) {
  const [text, setText] = useState(() => centsToText(cents));
  const blank = text.trim() === '';
  const message = error ? (blank || Number.isNaN(Number(text)) ? 'Enter an amount in dollars, such as 120 or 120.50.' : error.message) : undefined;
  return (
    <TextField
      ref={inputRef}
      label={label}
      hint={hint}
      inputMode="decimal"
      value={text}
      error={message}
      onBlur={onBlur}
      onChange={(e) => {
        setText(e.target.value);
        const cleaned = e.target.value.replace(/[$,\s]/g, '');
        const n = Number(cleaned);
        onCents(cleaned === '' || Number.isNaN(n) ? undefined : Math.round(n * 100));
      }}
    />
  );
}

/** A number input that leaves a blank as "no change" rather than a number. */
const optionalNumber = { setValueAs: (v: unknown) => (v === '' || v === null || v === undefined ? undefined : Number(v)) };

function LiveTotal({ control, request }: { control: Control<BidFormValues>; request: RequestDetail }) {
  const [parts, labour, finish, shipping] = useWatch({ control, name: ['partsCents', 'labourCents', 'finishCents', 'shippingCents'] });
  const values = [parts, labour, finish, shipping].map((v) => (typeof v === 'number' && Number.isFinite(v) ? v : 0));
  const total = values.reduce((a, b) => a + b, 0);
  const vsBudget = total - request.budgetCents;
  const vsBaseline = total - request.baseline.typicalCents;
  const compare = (diff: number, what: string) =>
    diff === 0 ? `the same as ${what}` : `${formatCents(Math.abs(diff), { whole: Math.abs(diff) % 100 === 0 })} ${diff > 0 ? 'over' : 'under'} ${what}`;
  return (
    <div className="rounded border border-petrol-100 bg-petrol-50 px-4 py-3" aria-live="polite">
      <div className="flex items-baseline justify-between gap-3">
        <span className="font-semibold text-petrol-900">Total to the rider</span>
        <span className="font-display text-2xl font-bold text-petrol-900" data-testid="bid-total">
          {formatCents(total)}
        </span>
      </div>
      <p className="mt-1 text-xs text-petrol-900">
        {compare(vsBudget, 'the rider’s budget')} · {compare(vsBaseline, 'the baseline')}
      </p>
    </div>
  );
}

function ReadyDate({ control, neededBy }: { control: Control<BidFormValues>; neededBy: string }) {
  const days = useWatch({ control, name: 'leadTimeDays' });
  if (typeof days !== 'number' || !Number.isInteger(days) || days < 1) return <p className="text-xs text-ink-500">Enter whole days to see the ready date.</p>;
  const ready = addDaysIso(todayIso(), days);
  const slack = daysBetween(ready, neededBy);
  return (
    <p className={`text-xs font-semibold ${slack < 0 ? 'text-rust-700' : 'text-moss-700'}`} data-testid="ready-date" aria-live="polite">
      Ready by {formatDay(ready)} if accepted today ·{' '}
      {slack < 0 ? `${-slack} days after the rider’s needed-by date` : slack === 0 ? 'on the needed-by date' : `${slack} days before the needed-by date`}
    </p>
  );
}

const TOP_FIELDS = ['partsCents', 'labourCents', 'finishCents', 'shippingCents', 'leadTimeDays', 'validUntil', 'message', 'proposedChange', 'proposedChange.description'];

/** A bid back into the form, with any proposed change laid out one entry per wheel of the request. */
export function bidToFormValues(bid: BidView, request: Pick<RequestDetail, 'wheels'>): BidFormValues {
  const change = bid.proposedChange;
  return {
    partsCents: bid.partsCents,
    labourCents: bid.labourCents,
    finishCents: bid.finishCents,
    shippingCents: bid.shippingCents,
    leadTimeDays: bid.leadTimeDays,
    validUntil: bid.validUntil.slice(0, 10),
    message: bid.message,
    proposedChange: change
      ? { description: change.description, wheels: request.wheels.map((w) => change.wheels.find((c) => c.position === w.position) ?? { position: w.position }) }
      : null,
  };
}

const schemaResolver = zodResolver(bidInputSchema);

/** Fields of a proposed wheel change left blank (react-hook-form may hold them as null or '') mean "keep as asked". */
function withoutBlankChanges(values: BidFormValues): BidFormValues {
  const change = values.proposedChange;
  if (!change) return values;
  const wheels = (change.wheels ?? []).map(
    (w) => Object.fromEntries(Object.entries(w as Record<string, unknown>).filter(([, v]) => v !== null && v !== undefined && v !== '' && !Number.isNaN(v))) as typeof w,
  );
  return { ...values, proposedChange: { ...change, wheels } };
}

export function BidForm({
  request,
  initial,
  submitLabel,
  onSubmit,
  onCancel,
  labourRateCentsPerHour,
}: {
  request: RequestDetail;
  initial?: BidFormValues;
  submitLabel: string;
  onSubmit: (input: BidInput) => Promise<unknown>;
  onCancel?: () => void;
  labourRateCentsPerHour: number | null;
}) {
  const ids = useId();
  const [failure, setFailure] = useState<string[] | null>(null);
  const defaultValidUntil = (() => {
    const twoWeeks = addDaysIso(todayIso(), 14);
    const closes = request.expiresAt?.slice(0, 10);
    return closes && closes < twoWeeks && closes > todayIso() ? closes : twoWeeks;
  })();
  const form = useForm<BidFormValues, unknown, BidInput>({
    resolver: (values, context, options) => schemaResolver(withoutBlankChanges(values), context, options),
    defaultValues: initial ?? {
      partsCents: undefined,
      labourCents: undefined,
      finishCents: 0,
      shippingCents: request.delivery === 'pickup' ? 0 : undefined,
      leadTimeDays: undefined,
      validUntil: defaultValidUntil,
      message: '',
      proposedChange: null,
    },
  });
  const { register, control, formState, setValue } = form;
  const errors = formState.errors;
  const proposal = useWatch({ control, name: 'proposedChange' });
  const proposing = proposal !== null && proposal !== undefined;

  const submit = form.handleSubmit(async (values) => {
    setFailure(null);
    // Wheels the builder left untouched are not part of the change.
    const change = values.proposedChange
      ? { ...values.proposedChange, wheels: values.proposedChange.wheels.filter((w) => Object.entries(w).some(([k, v]) => k !== 'position' && v !== undefined)) }
      : null;
    try {
      await onSubmit({ ...values, proposedChange: change });
    } catch (err) {
      if (!(err instanceof ApiError)) {
        setFailure(['The bid was not sent. Check your connection and try again.']);
        return;
      }
      const leftover: string[] = [];
      for (const [path, messages] of Object.entries(err.fieldErrors)) {
        if (!messages[0]) continue;
        if (TOP_FIELDS.includes(path) || path.startsWith('proposedChange.wheels.')) form.setError(path as FieldPath<BidFormValues>, { type: 'server', message: messages[0] });
        else leftover.push(...messages);
      }
      setFailure([err.message, ...leftover]);
    }
  });

  const changeError =
    (errors.proposedChange as { message?: string } | undefined)?.message ?? (errors.proposedChange?.wheels as { message?: string } | undefined)?.message;

  return (
    <form onSubmit={submit} noValidate className="space-y-5" aria-label={submitLabel}>
      {failure && (
        <Notice tone="danger" title={failure[0]}>
          {failure.length > 1 ? (
            <ul className="list-disc pl-5">
              {failure.slice(1).map((m) => (
                <li key={m}>{m}</li>
              ))}
            </ul>
          ) : (
            'Check the fields marked below; everything you typed is still here.'
          )}
        </Notice>
      )}

      <fieldset className="space-y-3">
        <legend className="font-display text-lg font-bold">Price</legend>
        <div className="grid gap-3 sm:grid-cols-2">
          {LINES.map((line) => (
            <MoneyField
              key={line.name}
              control={control}
              name={line.name}
              label={line.label}
              hint={line.name === 'labourCents' && labourRateCentsPerHour ? `${line.hint} Your rate: ${formatCents(labourRateCentsPerHour)}/hour.` : line.hint}
            />
          ))}
        </div>
        <LiveTotal control={control} request={request} />
      </fieldset>

      <fieldset className="space-y-3">
        <legend className="font-display text-lg font-bold">Timing</legend>
        <div className="grid gap-3 sm:grid-cols-2">
          <div className="space-y-1">
            <TextField
              label="Lead time (days)"
              type="number"
              min={1}
              max={365}
              step={1}
              inputMode="numeric"
              hint="From acceptance to ready to ship or collect."
              error={errors.leadTimeDays?.message}
              {...register('leadTimeDays', optionalNumber)}
            />
            <ReadyDate control={control} neededBy={request.neededBy} />
          </div>
          <TextField
            label="Bid valid until"
            type="date"
            min={todayIso()}
            hint={request.expiresAt ? `The request closes on ${formatDay(request.expiresAt)}.` : undefined}
            error={errors.validUntil?.message}
            {...register('validUntil')}
          />
        </div>
      </fieldset>

      <div className="space-y-1">
        <label htmlFor={`${ids}-message`} className="block text-sm font-semibold text-ink-700">
          Message to the rider
        </label>
        <textarea
          id={`${ids}-message`}
          rows={4}
          aria-invalid={errors.message ? true : undefined}
          aria-describedby={`${ids}-message-${errors.message ? 'error' : 'hint'}`}
          className="block w-full rounded border border-chalk-300 bg-white px-3 py-2 text-base text-ink-900 focus:border-petrol-500 aria-[invalid=true]:border-rust-500"
          {...register('message')}
        />
        {errors.message ? (
          <p id={`${ids}-message-error`} role="alert" className="text-xs font-semibold text-rust-700">
            {errors.message.message}
          </p>
        ) : (
          <p id={`${ids}-message-hint`} className="text-xs text-ink-500">
            What the price includes, the parts you have in mind, how you ship.
          </p>
        )}
      </div>

      <fieldset className="space-y-3 rounded border border-chalk-200 p-4">
        <legend className="px-1 font-display text-lg font-bold">Proposed change to the spec</legend>
        <label className="flex items-start gap-3">
          <input
            type="checkbox"
            className="mt-1 h-4 w-4 accent-petrol-600"
            checked={proposing}
            onChange={(e) =>
              setValue('proposedChange', e.target.checked ? { description: '', wheels: request.wheels.map((w) => ({ position: w.position })) } : null, {
                shouldDirty: true,
              })
            }
          />
          <span>
            <span className="block font-semibold">Propose a change</span>
            <span className="block text-xs text-ink-500">Suggest different spokes, gauge, rim, tire or lacing. The engine re-checks the changed wheel against the rider&rsquo;s frame when you send the bid.</span>
          </span>
        </label>
        {changeError && (
          <p role="alert" className="text-xs font-semibold text-rust-700">
            {changeError}
          </p>
        )}
        {proposing && (
          <div className="space-y-4">
            <div className="space-y-1">
              <label htmlFor={`${ids}-change`} className="block text-sm font-semibold text-ink-700">
                What you propose and why
              </label>
              <textarea
                id={`${ids}-change`}
                rows={3}
                aria-invalid={errors.proposedChange?.description ? true : undefined}
                className="block w-full rounded border border-chalk-300 bg-white px-3 py-2 text-base text-ink-900 focus:border-petrol-500 aria-[invalid=true]:border-rust-500"
                {...register('proposedChange.description')}
              />
              {errors.proposedChange?.description && (
                <p role="alert" className="text-xs font-semibold text-rust-700">
                  {errors.proposedChange.description.message}
                </p>
              )}
            </div>
            {request.wheels.map((wheel, i) => {
              const wErr = errors.proposedChange?.wheels?.[i];
              return (
                <fieldset key={wheel.position} className="space-y-2">
                  <legend className="text-sm font-semibold">{positionText(wheel.position)} wheel: leave blank to keep as asked</legend>
                  <div className="grid gap-3 sm:grid-cols-4">
                    <TextField
                      label="Rim width (mm)"
                      type="number"
                      step="any"
                      placeholder={String(wheel.rimWidthMm)}
                      error={wErr?.rimWidthMm?.message}
                      {...register(`proposedChange.wheels.${i}.rimWidthMm`, optionalNumber)}
                    />
                    <TextField
                      label="Tire width (mm)"
                      type="number"
                      step="any"
                      placeholder={String(wheel.tireWidthMm)}
                      error={wErr?.tireWidthMm?.message}
                      {...register(`proposedChange.wheels.${i}.tireWidthMm`, optionalNumber)}
                    />
                    <TextField
                      label="Spokes"
                      type="number"
                      step={1}
                      placeholder={String(wheel.spokes)}
                      error={wErr?.spokes?.message}
                      {...register(`proposedChange.wheels.${i}.spokes`, optionalNumber)}
                    />
                    <TextField
                      label="Spoke gauge"
                      type="number"
                      step={1}
                      placeholder={String(wheel.spokeGauge)}
                      error={wErr?.spokeGauge?.message}
                      {...register(`proposedChange.wheels.${i}.spokeGauge`, optionalNumber)}
                    />
                  </div>
                  <Controller
                    control={control}
                    name={`proposedChange.wheels.${i}.lacing`}
                    render={({ field, fieldState }) => (
                      <SelectField
                        label="Lacing"
                        value={field.value?.kind === 'radial' ? 'radial' : field.value?.kind === 'cross' ? `cross-${field.value.crosses}` : ''}
                        onChange={(e) => {
                          const v = e.target.value;
                          field.onChange(v === '' ? undefined : v === 'radial' ? { kind: 'radial' } : { kind: 'cross', crosses: Number(v.slice(6)) });
                        }}
                        onBlur={field.onBlur}
                        error={fieldState.error?.message}
                      >
                        <option value="">Keep as asked</option>
                        <option value="radial">Radial</option>
                        {[1, 2, 3, 4].map((n) => (
                          <option key={n} value={`cross-${n}`}>
                            {n} cross
                          </option>
                        ))}
                      </SelectField>
                    )}
                  />
                </fieldset>
              );
            })}
          </div>
        )}
      </fieldset>

      <div className="flex flex-wrap justify-end gap-3">
        {onCancel && (
          <Button type="button" tone="quiet" onClick={onCancel}>
            Cancel
          </Button>
        )}
        <Button type="submit" disabled={formState.isSubmitting}>
          {formState.isSubmitting ? 'Sending…' : submitLabel}
        </Button>
      </div>
    </form>
  );
}
