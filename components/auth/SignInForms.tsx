'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { signIn } from 'next-auth/react';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { Button } from '@/components/ui/Button';
import { TextField } from '@/components/ui/Field';
import { Notice } from '@/components/ui/Notice';
import { emailLinkSchema, signInSchema } from '@/lib/auth/schema';

type PasswordValues = z.input<typeof signInSchema>;
type LinkValues = z.input<typeof emailLinkSchema>;

export function PasswordSignInForm({ callbackUrl }: { callbackUrl: string }) {
  const router = useRouter();
  const [failure, setFailure] = useState<string | null>(null);
  const form = useForm<PasswordValues>({ resolver: zodResolver(signInSchema) });
  const { errors, isSubmitting } = form.formState;

  const onSubmit = form.handleSubmit(async (values) => {
    setFailure(null);
    const result = await signIn('password', { ...values, redirect: false });
    if (!result || result.error) {
      setFailure(result?.status === 429 ? 'Too many sign-in attempts. Please wait a few minutes and try again.' : 'That e-mail and password do not match an account.');
      return;
    }
    router.push(callbackUrl);
    router.refresh();
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4" aria-label="Sign in with password">
      {failure && <Notice tone="danger">{failure}</Notice>}
      <TextField label="E-mail" type="email" autoComplete="email" error={errors.email?.message} {...form.register('email')} />
      <TextField label="Password" type="password" autoComplete="current-password" error={errors.password?.message} {...form.register('password')} />
      <Button type="submit" disabled={isSubmitting} className="w-full">
        {isSubmitting ? 'Signing in…' : 'Sign in'}
      </Button>
    </form>
  );
}

export function EmailLinkForm({ callbackUrl }: { callbackUrl: string }) {
  const form = useForm<LinkValues>({ resolver: zodResolver(emailLinkSchema) });
  const { errors, isSubmitting } = form.formState;
  const onSubmit = form.handleSubmit(async (values) => {
    await signIn('email', { email: values.email, callbackUrl });
  });
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4" aria-label="Sign in with an e-mailed link">
      <TextField label="E-mail for a one-time link" type="email" autoComplete="email" error={errors.email?.message} {...form.register('email')} />
      <Button type="submit" tone="secondary" disabled={isSubmitting} className="w-full">
        {isSubmitting ? 'Sending…' : 'E-mail me a sign-in link'}
      </Button>
    </form>
  );
}
