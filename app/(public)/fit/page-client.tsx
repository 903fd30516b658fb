'use client';

import { useState } from 'react';
import { useDebounced } from '@/components/hooks/useDebounced';
import { zodResolver } from '@hookform/resolvers/zod';
import { keepPreviousData, useQuery } from '@tanstack/react-query';
import { Controller, useForm, useWatch, type Control } from 'react-hook-form';
import { SelectField, TextField } from '@/components/ui/Field';
import { Notice } from '@/components/ui/Notice';
import { Spinner } from '@/components/ui/Spinner';
import { FitResultPanel } from '@/components/wheel/FitResultPanel';
import { MM_PER_INCH, type LengthUnit } from '@/lib/format';
import { BB_SHELLS, FINISHES, HUBS, NOMINAL_DIAMETERS_IN, SPOKE_GAUGES, fitRequestSchema, type FitRequestInput, type FitResult } from '@/lib/wheel';

const DEFAULTS: FitRequestInput = {
  position: 'rear',
  nominalDiameterIn: 26,
  rimWidthMm: 80,
  tireWidthMm: 76,
  spokes: 36,
  spokeGauge: 12,
  crosses: 3,
  hubId: 'rear-igh3-coaster-120',
  cog: 'standard',
  chainringTeeth: 36,
  cogTeeth: 18,
  frameRearSpacingMm: 120,
  forkSpacingMm: 100,
  bbShellWidthMm: 69.85,
  chainstayLengthMm: 460,
  finish: 'bare',
};

type FitResponse = { ok: true; result: FitResult } | { ok: false; error: string; fieldErrors?: Record<string, string[]> };

async function postFit(values: FitRequestInput): Promise<FitResponse> {
  const res = await fetch('/api/fit', { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(values) });
  const body = await res.json();
  if (res.ok) return { ok: true, result: body as FitResult };
  if (res.status === 400) return { ok: false, error: body.error, fieldErrors: body.fieldErrors };
  throw new Error(body.error ?? `The fit check failed (${res.status}).`);
}


/** A millimetre value shown and typed in the chosen unit. */
function LengthField({ control, name, label, unit, hint }: { control: Control<FitRequestInput>; name: 'rimWidthMm' | 'tireWidthMm' | 'chainstayLengthMm'; label: string; unit: LengthUnit; hint?: string }) {
  return (
    <Controller
      control={control}
      name={name}
      render={({ field, fieldState }) => {
        const mm = typeof field.value === 'number' ? field.value : undefined;
        const shown = mm === undefined ? '' : unit === 'mm' ? String(mm) : String(Number((mm / MM_PER_INCH).toFixed(2)));
        return (
          <TextField
            label={`${label} (${unit})`}
            type="number"
            step={unit === 'mm' ? 1 : 0.05}
            inputMode="decimal"
            value={shown}
            hint={hint}
            error={fieldState.error?.message}
            onBlur={field.onBlur}
            onChange={(e) => {
              const n = e.target.valueAsNumber;
              field.onChange(Number.isNaN(n) ? undefined : unit === 'mm' ? n : Number((n * MM_PER_INCH).toFixed(1)));
            }}
          />
        );
      }}
    />
  );
}

export function FitPageClient() {
  const [unit, setUnit] = useState<LengthUnit>('mm');
  const form = useForm<FitRequestInput>({ resolver: zodResolver(fitRequestSchema), mode: 'onChange', defaultValues: DEFAULTS });
  const { register, control, formState } = form;
  const values = useWatch({ control }) as FitRequestInput;
  const position = values.position ?? 'rear';
  const request = useDebounced(values, 300);
  const query = useQuery({ queryKey: ['fit', request], queryFn: () => postFit(request), placeholderData: keepPreviousData });
  const num = { valueAsNumber: true } as const;
  const err = (name: keyof FitRequestInput) => formState.errors[name]?.message as string | undefined;
  const hubs = HUBS.filter((h) => h.position === position);

  return (
    <div className="grid gap-6 lg:grid-cols-[minmax(0,5fr)_minmax(0,6fr)]">
      <form className="space-y-5" aria-label="Wheel and frame" onSubmit={(e) => e.preventDefault()} noValidate>
        <fieldset className="space-y-3 rounded-lg border border-chalk-200 bg-white p-4">
          <legend className="px-1 font-display text-lg font-bold">Wheel</legend>
          <div className="flex flex-wrap gap-4">
            {(['rear', 'front'] as const).map((p) => (
              <label key={p} className="flex items-center gap-2 text-sm font-semibold">
                <input
                  type="radio"
                  value={p}
                  className="accent-petrol-600"
                  {...register('position', {
                    onChange: () => form.setValue('hubId', p === 'rear' ? 'rear-igh3-coaster-120' : 'front-100', { shouldValidate: true }),
                  })}
                />
                {p === 'rear' ? 'Rear wheel' : 'Front wheel'}
              </label>
            ))}
            <div className="ml-auto flex items-center gap-1 text-sm" role="group" aria-label="Units">
              {(['mm', 'in'] as const).map((u) => (
                <button
                  key={u}
                  type="button"
                  aria-pressed={unit === u}
                  onClick={() => setUnit(u)}
                  className={`rounded px-2.5 py-1 font-semibold ${unit === u ? 'bg-petrol-600 text-white' : 'bg-chalk-100 text-ink-700'}`}
                >
                  {u === 'mm' ? 'Millimetres' : 'Inches'}
                </button>
              ))}
            </div>
          </div>
          <div className="grid gap-3 sm:grid-cols-2">
            <SelectField label="Wheel size" error={err('nominalDiameterIn')} {...register('nominalDiameterIn', num)}>
              {NOMINAL_DIAMETERS_IN.map((d) => (
                <option key={d} value={d}>
                  {d} inch
                </option>
              ))}
            </SelectField>
            <SelectField label="Finish" error={err('finish')} {...register('finish')}>
              {FINISHES.map((f) => (
                <option key={f} value={f}>
                  {f}
                </option>
              ))}
            </SelectField>
            <LengthField control={control} name="rimWidthMm" label="Rim width" unit={unit} hint="3 inch is about 80 mm, 4 inch about 100 mm." />
            <LengthField control={control} name="tireWidthMm" label="Tire width" unit={unit} />
            <TextField label="Spoke count" type="number" step={4} error={err('spokes')} hint="36, 72 or 144 are usual." {...register('spokes', num)} />
            <SelectField label="Spoke gauge" error={err('spokeGauge')} hint="Lower number, thicker spoke." {...register('spokeGauge', num)}>
              {SPOKE_GAUGES.map((g) => (
                <option key={g} value={g}>
                  {g} gauge
                </option>
              ))}
            </SelectField>
            <SelectField label="Lacing" error={err('crosses')} {...register('crosses', num)}>
              <option value={0}>Radial</option>
              {[1, 2, 3, 4].map((x) => (
                <option key={x} value={x}>
                  {x}-cross
                </option>
              ))}
            </SelectField>
            <TextField label="Measured ERD (mm, optional)" type="number" error={err('erdMm')} {...register('erdMm', { setValueAs: (v) => (v === '' || v === undefined ? undefined : Number(v)) })} />
          </div>
        </fieldset>

        <fieldset className="space-y-3 rounded-lg border border-chalk-200 bg-white p-4">
          <legend className="px-1 font-display text-lg font-bold">Hub and drive</legend>
          <SelectField label="Hub" error={err('hubId')} {...register('hubId')}>
            {hubs.map((h) => (
              <option key={h.id} value={h.id}>
                {h.label}
              </option>
            ))}
          </SelectField>
          {position === 'rear' && (
            <div className="grid gap-3 sm:grid-cols-3">
              <SelectField label="Cog" error={err('cog')} {...register('cog')}>
                <option value="standard">Standard flat</option>
                <option value="offset">Offset (dished)</option>
              </SelectField>
              <TextField label="Chainring teeth" type="number" error={err('chainringTeeth')} {...register('chainringTeeth', num)} />
              <TextField label="Cog teeth" type="number" error={err('cogTeeth')} {...register('cogTeeth', num)} />
            </div>
          )}
        </fieldset>

        <fieldset className="space-y-3 rounded-lg border border-chalk-200 bg-white p-4">
          <legend className="px-1 font-display text-lg font-bold">Frame</legend>
          <div className="grid gap-3 sm:grid-cols-2">
            {position === 'rear' ? (
              <>
                <TextField label="Rear dropout spacing (mm)" type="number" error={err('frameRearSpacingMm')} {...register('frameRearSpacingMm', num)} />
                <SelectField label="Bottom-bracket shell" error={err('bbShellWidthMm')} {...register('bbShellWidthMm', num)}>
                  {BB_SHELLS.map((s) => (
                    <option key={s.id} value={s.widthMm}>
                      {s.label}
                    </option>
                  ))}
                </SelectField>
                <LengthField control={control} name="chainstayLengthMm" label="Chainstay length" unit={unit} />
                <TextField
                  label="Spindle length (mm, optional)"
                  type="number"
                  error={err('spindleLengthMm')}
                  hint="Left empty, we pick what the shell and wheel call for."
                  {...register('spindleLengthMm', { setValueAs: (v) => (v === '' || v === undefined ? undefined : Number(v)) })}
                />
              </>
            ) : (
              <TextField label="Fork spacing (mm)" type="number" error={err('forkSpacingMm')} {...register('forkSpacingMm', num)} />
            )}
          </div>
        </fieldset>
        <p className="text-xs text-ink-500">
          Spacing and shell widths are in millimetres, as the trade measures them. Every figure here is an estimate from a geometric model; a
          qualified wheel builder confirms it before parts are bought.
        </p>
      </form>

      <div aria-live="polite" aria-busy={query.isFetching}>
        {query.isError && <Notice tone="danger">{(query.error as Error).message} Check your connection and change any field to try again.</Notice>}
        {query.data && !query.data.ok && (
          <Notice tone="caution" title="Some fields need attention">
            <ul className="list-disc pl-5">
              {Object.entries(query.data.fieldErrors ?? { input: [query.data.error] }).map(([field, messages]) => (
                <li key={field}>{messages[0]}</li>
              ))}
            </ul>
          </Notice>
        )}
        {query.isPending && <Spinner label="Working out the fit…" />}
        {query.data?.ok && (
          <div className={query.isFetching ? 'opacity-70 transition-opacity' : ''}>
            <FitResultPanel result={query.data.result} unit={unit} />
          </div>
        )}
      </div>
    </div>
  );
}
