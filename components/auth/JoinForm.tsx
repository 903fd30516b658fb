'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { signIn } from 'next-auth/react';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { useForm, useWatch, type FieldErrors } from 'react-hook-form';
import type { z } from 'zod';
import { Button } from '@/components/ui/Button';
import { TextField } from '@/components/ui/Field';
import { Notice } from '@/components/ui/Notice';
import { signUpSchema } from '@/lib/auth/schema';

type JoinValues = z.input<typeof signUpSchema>;
type BuilderErrors = FieldErrors<Extract<JoinValues, { role: 'builder' }>>;

export function JoinForm() {
  const router = useRouter();
  const [failure, setFailure] = useState<string | null>(null);
  const form = useForm<JoinValues>({ resolver: zodResolver(signUpSchema), defaultValues: { role: 'rider' } });
  const role = useWatch({ control: form.control, name: 'role' });
  const errors = form.formState.errors as BuilderErrors;

  const onSubmit = form.handleSubmit(async (values) => {
    setFailure(null);
    const res = await fetch('/api/accounts', { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(values) });
    if (!res.ok) {
      const body = (await res.json().catch(() => ({}))) as { error?: string; fieldErrors?: Record<string, string[]> };
      for (const [field, messages] of Object.entries(body.fieldErrors ?? {})) {
        form.setError(field as keyof JoinValues, { message: messages[0] });
      }
      setFailure(body.error ?? 'We could not create the account. Try again.');
      return;
    }
    const signedIn = await signIn('password', { email: values.email, password: values.password, redirect: false });
    router.push(signedIn?.ok ? '/welcome' : '/sign-in');
    router.refresh();
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-5" aria-label="Create an account">
      {failure && <Notice tone="danger">{failure}</Notice>}
      <fieldset>
        <legend className="mb-2 text-sm font-semibold text-ink-700">I am joining as</legend>
        <div className="grid gap-3 sm:grid-cols-2">
          {[
            { value: 'rider', title: 'A rider', body: 'I want a wheel built.' },
            { value: 'builder', title: 'A wheel builder', body: 'I build wheels and want to bid. This also creates my shop.' },
          ].map((option) => (
            <label
              key={option.value}
              className="flex cursor-pointer gap-3 rounded-lg border border-chalk-300 bg-white p-3 has-[:checked]:border-petrol-500 has-[:checked]:bg-petrol-50"
            >
              <input type="radio" value={option.value} className="mt-1 accent-petrol-600" {...form.register('role')} />
              <span>
                <span className="block font-semibold">{option.title}</span>
                <span className="block text-sm text-ink-500">{option.body}</span>
              </span>
            </label>
          ))}
        </div>
      </fieldset>
      <TextField label="Your name" autoComplete="name" error={errors.name?.message} {...form.register('name')} />
      <TextField label="E-mail" type="email" autoComplete="email" error={errors.email?.message} {...form.register('email')} />
      <TextField
        label="Password"
        type="password"
        autoComplete="new-password"
        hint="At least 10 characters."
        error={errors.password?.message}
        {...form.register('password')}
      />
      {role === 'builder' && (
        <div className="grid gap-4 sm:grid-cols-2">
          <TextField label="Shop name" error={errors.shopName?.message} {...form.register('shopName')} />
          <TextField label="Shop ZIP code" inputMode="numeric" hint="Places your shop on the map." error={errors.zip?.message} {...form.register('zip')} />
        </div>
      )}
      <Button type="submit" disabled={form.formState.isSubmitting} className="w-full">
        {form.formState.isSubmitting ? 'Creating your account…' : 'Create account'}
      </Button>
    </form>
  );
}
