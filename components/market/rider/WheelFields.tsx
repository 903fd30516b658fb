'use client';

import { useFormContext, useWatch, type FieldErrors } from 'react-hook-form';
import { SelectField, TextField } from '@/components/ui/Field';
import type { RequestFormValues } from '@/lib/market/schema';
import { FINISHES, HUBS, NOMINAL_DIAMETERS_IN, SPOKE_GAUGES } from '@/lib/wheel';

const num = { valueAsNumber: true } as const;

/** The fields of one wheel in a request; `index` is its place in the wheels array. */
export function WheelFields({ index }: { index: number }) {
  const { register, control, formState } = useFormContext<RequestFormValues>();
  const position = useWatch({ control, name: `wheels.${index}.position` });
  const lacingKind = useWatch({ control, name: `wheels.${index}.lacing.kind` });
  const errors = (formState.errors.wheels as FieldErrors<RequestFormValues['wheels'][number]>[] | undefined)?.[index];
  const hubs = HUBS.filter((h) => h.position === position);
  const lacingErrors = errors?.lacing as { message?: string; crosses?: { message?: string }; description?: { message?: string } } | undefined;
  return (
    <fieldset className="space-y-3 rounded-lg border border-chalk-200 bg-white p-4" data-testid={`wheel-${position}`}>
      <legend className="px-1 font-display text-lg font-bold">{position === 'front' ? 'Front wheel' : 'Rear wheel'}</legend>
      <div className="grid gap-3 sm:grid-cols-2">
        <SelectField label="Wheel size" error={errors?.nominalDiameterIn?.message} {...register(`wheels.${index}.nominalDiameterIn`, num)}>
          {NOMINAL_DIAMETERS_IN.map((d) => (
            <option key={d} value={d}>
              {d} inch
            </option>
          ))}
        </SelectField>
        <SelectField label="Finish" error={errors?.finish?.message} {...register(`wheels.${index}.finish`)}>
          {FINISHES.map((f) => (
            <option key={f} value={f}>
              {f}
            </option>
          ))}
        </SelectField>
        <TextField label="Rim width (mm)" type="number" hint="3 inch ≈ 80 mm, 4 inch ≈ 100 mm, 5 inch ≈ 120 mm." error={errors?.rimWidthMm?.message} {...register(`wheels.${index}.rimWidthMm`, num)} />
        <TextField label="Tire width (mm)" type="number" error={errors?.tireWidthMm?.message} {...register(`wheels.${index}.tireWidthMm`, num)} />
        <TextField label="Spoke count" type="number" step={4} hint="36, 72 or 144." error={errors?.spokes?.message} {...register(`wheels.${index}.spokes`, num)} />
        <SelectField label="Spoke gauge" hint="Lower number, thicker spoke." error={errors?.spokeGauge?.message} {...register(`wheels.${index}.spokeGauge`, num)}>
          {SPOKE_GAUGES.map((g) => (
            <option key={g} value={g}>
              {g} gauge
            </option>
          ))}
        </SelectField>
        <SelectField label="Lacing" error={lacingErrors?.message} {...register(`wheels.${index}.lacing.kind`)}>
          <option value="cross">Crossed</option>
          <option value="radial">Radial</option>
          <option value="custom">Custom pattern</option>
        </SelectField>
        {lacingKind === 'cross' && (
          <SelectField label="Crosses" error={lacingErrors?.crosses?.message} {...register(`wheels.${index}.lacing.crosses`, num)}>
            {[1, 2, 3, 4].map((x) => (
              <option key={x} value={x}>
                {x}-cross
              </option>
            ))}
          </SelectField>
        )}
        {lacingKind === 'custom' && (
          <TextField label="Describe the pattern" error={lacingErrors?.description?.message} {...register(`wheels.${index}.lacing.description`)} />
        )}
      </div>
      <SelectField label="Hub and brake" error={errors?.hubId?.message} {...register(`wheels.${index}.hubId`)}>
        {hubs.map((h) => (
          <option key={h.id} value={h.id}>
            {h.label}
          </option>
        ))}
      </SelectField>
    </fieldset>
  );
}
