'use client';

import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Button, ButtonLink } from '@/components/ui/button';
import { Field, Input, Notice } from '@/components/ui/field';
import { signInWithPassword } from '@/lib/auth-client';
import { apiSend, ApiError, problemText } from '@/lib/api-client';

interface Props {
  token: string;
  email: string;
  hasAccount: boolean;
}

export function AcceptInvitationForm({ token, email, hasAccount }: Props) {
  const form = useForm<{ name: string; password: string }>();
  const [message, setMessage] = useState<{ tone: 'error' | 'ok'; text: string }>();
  const [fieldErrors, setFieldErrors] = useState<Record<string, string[]>>({});

  const onSubmit = form.handleSubmit(async (values) => {
    setMessage(undefined);
    try {
      await apiSend('POST', '/api/invitations/accept', hasAccount ? { token } : { token, ...values }, { fallback: 'The invitation could not be accepted.' });
    } catch (err) {
      setFieldErrors(err instanceof ApiError ? (err.fields ?? {}) : {});
      setMessage({ tone: 'error', text: problemText(err) });
      return;
    }
    if (hasAccount) {
      setMessage({ tone: 'ok', text: 'Done: you are now a member. Sign in to continue.' });
      return;
    }
    const signedIn = await signInWithPassword(email, values.password);
    if (signedIn.ok) window.location.assign('/');
    else setMessage({ tone: 'error', text: signedIn.message });
  });

  if (message?.tone === 'ok') {
    return (
      <div className="flex flex-col gap-3">
        <Notice tone="ok">{message.text}</Notice>
        <ButtonLink href="/signin">Sign in</ButtonLink>
      </div>
    );
  }

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
      {!hasAccount && (
        <>
          <Field id="name" label="Your name" error={fieldErrors.name?.[0]}>
            <Input id="name" autoComplete="name" {...form.register('name')} />
          </Field>
          <Field id="password" label="Choose a password" hint="At least 10 characters." error={fieldErrors.password?.[0]}>
            <Input id="password" type="password" autoComplete="new-password" {...form.register('password')} />
          </Field>
        </>
      )}
      {message && <Notice tone="error">{message.text}</Notice>}
      <Button type="submit" size="large" disabled={form.formState.isSubmitting}>
        Accept the invitation
      </Button>
    </form>
  );
}
