'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect, useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { Button } from '@/components/ui/button';
import { Field, Input, Notice } from '@/components/ui/field';
import { describeAuthError, requestSignInLink, signInWithPassword } from '@/lib/auth-client';
import { sameOriginPath } from '@/lib/safe-redirect';
import { useHydrated } from '@/lib/use-hydrated';
import { emailSchema, signInSchema } from '@/lib/validation/auth';

type Mode = 'password' | 'link';

export function SignInForm({ callbackUrl, initialError }: { callbackUrl: string; initialError?: string }) {
  const [mode, setMode] = useState<Mode>('password');
  const [message, setMessage] = useState<string | undefined>(initialError ? describeAuthError(initialError) : undefined);
  const schema = mode === 'password' ? signInSchema : z.object({ email: emailSchema, password: z.string().optional() });
  const form = useForm<{ email: string; password?: string }>({ resolver: zodResolver(schema) });
  const { errors, isSubmitting } = form.formState;
  const hydrated = useHydrated();

  // On a slow phone people type before the page's script runs: keep what they typed.
  useEffect(() => {
    for (const name of ['email', 'password'] as const) {
      const value = (document.getElementById(name) as HTMLInputElement | null)?.value;
      if (value) form.setValue(name, value);
    }
  }, [form]);

  const onSubmit = form.handleSubmit(async ({ email, password }) => {
    setMessage(undefined);
    if (mode === 'password') {
      const result = await signInWithPassword(email, password ?? '', callbackUrl);
      if (result.ok) window.location.assign(sameOriginPath(callbackUrl, window.location.origin));
      else setMessage(result.message);
    } else {
      const result = await requestSignInLink(email, callbackUrl);
      if (result.ok) window.location.assign('/signin/check-email');
      else setMessage(result.message);
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4" aria-describedby={message ? 'signin-message' : undefined}>
      <h1 className="text-2xl font-extrabold">Sign in</h1>
      {/* The same pressed-button choice as the field forms: a labelled group, one button pressed. */}
      <fieldset className="flex flex-col gap-1">
        <legend className="mb-1 font-bold">How to sign in</legend>
        <div className="grid grid-cols-2 gap-2">
          {(['password', 'link'] as const).map((m) => (
            <button
              key={m}
              type="button"
              aria-pressed={mode === m}
              onClick={() => {
                setMode(m);
                setMessage(undefined);
              }}
              className={`min-h-touch rounded-lg border-2 px-2 font-bold ${mode === m ? 'border-rootstock bg-rootstock-tint' : 'border-line bg-panel'}`}
            >
              {m === 'password' ? 'Password' : 'E-mail me a link'}
            </button>
          ))}
        </div>
      </fieldset>
      <Field id="email" label="E-mail" error={errors.email?.message}>
        <Input id="email" type="email" autoComplete="email" inputMode="email" {...form.register('email')} />
      </Field>
      {mode === 'password' && (
        <Field id="password" label="Password" error={errors.password?.message}>
          <Input id="password" type="password" autoComplete="current-password" {...form.register('password')} />
        </Field>
      )}
      {message && (
        <div id="signin-message" aria-live="assertive">
          <Notice tone="error">{message}</Notice>
        </div>
      )}
      {/* Until the script runs, a tap would submit the form natively and lose it. */}
      <Button type="submit" size="large" disabled={!hydrated || isSubmitting}>
        {isSubmitting ? 'Signing in…' : mode === 'password' ? 'Sign in' : 'Send me a sign-in link'}
      </Button>
    </form>
  );
}
