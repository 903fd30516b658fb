'use client';

// Shop settings: what the shop builds (it drives the board's capability filter), its labour rate,
// where it is, and how many builds it takes on at once.
import { zodResolver } from '@hookform/resolvers/zod';
import { useRef, useState } from 'react';
import { Controller, useForm, type Control, type FieldPath } from 'react-hook-form';
import type { z } from 'zod';
import { Button } from '@/components/ui/Button';
import { TextField } from '@/components/ui/Field';
import { Notice } from '@/components/ui/Notice';
import { RIM_WIDTH_CLASSES_IN, shopSettingsSchema, type ShopSettingsInput } from '@/lib/market/schema';
import type { ShopSettings } from '@/lib/market/shopSettings';
import { NOMINAL_DIAMETERS_IN, SPOKE_GAUGES } from '@/lib/wheel';
import { useSaveShopSettings, useShopSettings } from './api';
import { ApiError } from './fetchJson';

type Values = z.input<typeof shopSettingsSchema>;
type NumberListName = 'capabilities.rimWidthsIn' | 'capabilities.diametersIn' | 'capabilities.gauges' | 'capabilities.spokeCounts';

const COMMON_SPOKE_COUNTS = [28, 32, 36, 40, 48, 72, 144];
const COMMON_FINISHES = ['bare', 'polished', 'painted', 'plated', 'powder coat', 'anodised', 'black'];

function toValues(s: ShopSettings): Values {
  return { capabilities: s.capabilities, labourRateCentsPerHour: s.labourRateCentsPerHour, zip: s.zip ?? '', buildsAtOnce: s.buildsAtOnce };
}

/** A set of checkboxes holding a list of numbers. */
function NumberChoices({
  control,
  name,
  legend,
  choices,
  unit,
}: {
  control: Control<Values>;
  name: NumberListName;
  legend: string;
  choices: readonly number[];
  unit: (n: number) => string;
}) {
  return (
    <Controller
      control={control}
      name={name}
      render={({ field, fieldState }) => {
        const selected = (field.value ?? []) as number[];
        const all = [...new Set([...choices, ...selected])].sort((a, b) => a - b);
        return (
          <fieldset>
            <legend className="text-sm font-semibold text-ink-700">{legend}</legend>
            <div className="mt-2 flex flex-wrap gap-2">
              {all.map((n) => (
                <label key={n} className="flex cursor-pointer items-center gap-2 rounded border border-chalk-300 bg-white px-3 py-1.5 text-sm has-[:checked]:border-petrol-500 has-[:checked]:bg-petrol-50">
                  <input
                    type="checkbox"
                    className="accent-petrol-600"
                    checked={selected.includes(n)}
                    onChange={(e) => field.onChange(e.target.checked ? [...selected, n].sort((a, b) => a - b) : selected.filter((x) => x !== n))}
                    onBlur={field.onBlur}
                  />
                  {unit(n)}
                </label>
              ))}
            </div>
            {fieldState.error?.message && (
              <p role="alert" className="mt-1 text-xs font-semibold text-rust-700">
                {fieldState.error.message}
              </p>
            )}
          </fieldset>
        );
      }}
    />
  );
}

function FinishChoices({ control }: { control: Control<Values> }) {
  const otherRef = useRef<HTMLInputElement>(null);
  return (
    <Controller
      control={control}
      name="capabilities.finishes"
      render={({ field, fieldState }) => {
        const selected = (field.value ?? []) as string[];
        const listed = [...new Set([...COMMON_FINISHES, ...selected])];
        return (
          <fieldset>
            <legend className="text-sm font-semibold text-ink-700">Finishes you offer</legend>
            <div className="mt-2 flex flex-wrap gap-2">
              {listed.map((f) => (
                <label key={f} className="flex cursor-pointer items-center gap-2 rounded border border-chalk-300 bg-white px-3 py-1.5 text-sm has-[:checked]:border-petrol-500 has-[:checked]:bg-petrol-50">
                  <input
                    type="checkbox"
                    className="accent-petrol-600"
                    checked={selected.includes(f)}
                    onChange={(e) => field.onChange(e.target.checked ? [...selected, f] : selected.filter((x) => x !== f))}
                  />
                  {f}
                </label>
              ))}
            </div>
            <div className="mt-2 flex max-w-md items-end gap-2">
              <div className="flex-1">
                <TextField
                  ref={otherRef}
                  label="Another finish"
                  placeholder="e.g. gold-tone plating"
                  onKeyDown={(e) => {
                    if (e.key !== 'Enter') return;
                    e.preventDefault();
                    const v = e.currentTarget.value.trim();
                    if (v && !selected.includes(v)) field.onChange([...selected, v]);
                    e.currentTarget.value = '';
                  }}
                />
              </div>
              <Button
                type="button"
                tone="secondary"
                onClick={() => {
                  const input = otherRef.current;
                  const v = input?.value.trim();
                  if (input && v && !selected.includes(v)) field.onChange([...selected, v]);
                  if (input) input.value = '';
                }}
              >
                Add
              </Button>
            </div>
            {fieldState.error?.message && (
              <p role="alert" className="mt-1 text-xs font-semibold text-rust-700">
                {fieldState.error.message}
              </p>
            )}
          </fieldset>
        );
      }}
    />
  );
}

function LabourRateField({ control }: { control: Control<Values> }) {
  return (
    <Controller
      control={control}
      name="labourRateCentsPerHour"
      render={({ field, fieldState }) => <LabourRateInput cents={field.value} onCents={field.onChange} onBlur={field.onBlur} inputRef={field.ref} error={fieldState.error?.message} />}
    />
  );
}

function LabourRateInput({
  cents,
  onCents,
  onBlur,
  inputRef,
  error,
}: {
  cents: number | null | undefined;
  onCents: (cents: number | null | undefined) => void;
  onBlur: () => void;
  inputRef: React.Ref<HTMLInputElement>;
  error?: string;
}) {
  const [text, setText] = useState(() => (typeof cents === 'number' ? (cents % 100 === 0 ? String(cents / 100) : (cents / 100).toFixed(2)) : ''));
  const bad = text.trim() !== '' && Number.isNaN(Number(text.replace(/[$,\s]/g, '')));
  return (
    <TextField
      ref={inputRef}
      label="Labour rate ($ per hour)"
      inputMode="decimal"
      hint="Shown to you beside the labour line when you bid. Leave blank if you price by the job."
      value={text}
      error={bad ? 'Enter dollars per hour, such as 65 or 72.50.' : error}
      onBlur={onBlur}
      onChange={(e) => {
        setText(e.target.value);
        const cleaned = e.target.value.replace(/[$,\s]/g, '');
        const n = Number(cleaned);
        onCents(cleaned === '' ? null : Number.isNaN(n) ? undefined : Math.round(n * 100));
      }}
    />
  );
}

const KNOWN = ['zip', 'buildsAtOnce', 'labourRateCentsPerHour', 'capabilities.rimWidthsIn', 'capabilities.diametersIn', 'capabilities.gauges', 'capabilities.spokeCounts', 'capabilities.finishes', 'capabilities.hubDrilling'];

export function ShopSettingsForm({ initial }: { initial: ShopSettings }) {
  const settings = useShopSettings(initial);
  const save = useSaveShopSettings();
  const [failure, setFailure] = useState<string | null>(null);
  const [saved, setSaved] = useState<string | null>(null);
  const form = useForm<Values, unknown, ShopSettingsInput>({ resolver: zodResolver(shopSettingsSchema), defaultValues: toValues(initial) });
  const { control, register, formState } = form;
  const current = settings.data ?? initial;

  const onSubmit = form.handleSubmit(async (values) => {
    setFailure(null);
    setSaved(null);
    try {
      const result = await save.mutateAsync(values);
      form.reset(toValues(result));
      setSaved(`Saved. Your shop is listed in ${result.city}, ${result.region}; the board now filters by these capabilities.`);
    } catch (err) {
      if (!(err instanceof ApiError)) {
        setFailure('The settings were not saved. Check your connection and try again.');
        return;
      }
      for (const [path, messages] of Object.entries(err.fieldErrors)) {
        if (messages[0] && (KNOWN.includes(path) || path === 'capabilities')) form.setError(path as FieldPath<Values>, { type: 'server', message: messages[0] });
      }
      setFailure(err.message);
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-6" aria-label="Shop settings">
      {failure && (
        <Notice tone="danger" title={failure}>
          Check the fields marked below; your changes are still here.
        </Notice>
      )}
      {saved && <Notice tone="success">{saved}</Notice>}

      <section className="space-y-5 rounded-lg border border-chalk-200 bg-white p-5 shadow-card">
        <div>
          <h2 className="text-xl font-bold">What your shop builds</h2>
          <p className="text-sm text-ink-500">
            The board shows requests whose every wheel fits inside these lists. Leave a list empty to take any value. Builders confirm each build with the
            actual parts; drilled flanges and very heavy wheels follow qualified local practice.
          </p>
        </div>
        <NumberChoices control={control} name="capabilities.diametersIn" legend="Wheel sizes" choices={NOMINAL_DIAMETERS_IN} unit={(n) => `${n} inch`} />
        <NumberChoices control={control} name="capabilities.rimWidthsIn" legend="Rim widths" choices={RIM_WIDTH_CLASSES_IN} unit={(n) => `${n} inch`} />
        <NumberChoices control={control} name="capabilities.gauges" legend="Spoke gauges" choices={SPOKE_GAUGES} unit={(n) => `${n} g`} />
        <NumberChoices control={control} name="capabilities.spokeCounts" legend="Spoke counts" choices={COMMON_SPOKE_COUNTS} unit={(n) => `${n}`} />
        <label className="flex items-start gap-3">
          <input type="checkbox" className="mt-1 h-4 w-4 accent-petrol-600" {...register('capabilities.hubDrilling')} />
          <span>
            <span className="block font-semibold">We drill hub flanges</span>
            <span className="block text-xs text-ink-500">Re-drilling a hub for more spokes weakens the flange if done wrong; offer it only if your shop does it to local practice.</span>
          </span>
        </label>
        <FinishChoices control={control} />
      </section>

      <section className="space-y-4 rounded-lg border border-chalk-200 bg-white p-5 shadow-card">
        <h2 className="text-xl font-bold">Shop and workload</h2>
        <div className="grid gap-4 sm:grid-cols-3">
          <TextField
            label="Shop ZIP code"
            inputMode="numeric"
            autoComplete="postal-code"
            hint={`Now listed in ${current.city}, ${current.region}. Distances on the board count from here.`}
            error={formState.errors.zip?.message}
            {...register('zip')}
          />
          <LabourRateField control={control} />
          <TextField
            label="Builds at once"
            type="number"
            min={1}
            max={100}
            step={1}
            inputMode="numeric"
            hint="How many wheels you can have on the bench together."
            error={formState.errors.buildsAtOnce?.message}
            {...register('buildsAtOnce', { valueAsNumber: true })}
          />
        </div>
      </section>

      <div className="flex justify-end">
        <Button type="submit" disabled={formState.isSubmitting}>
          {formState.isSubmitting ? 'Saving…' : 'Save settings'}
        </Button>
      </div>
    </form>
  );
}
