'use client';

import Link from 'next/link';
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/field';
import { apiSend, problemText } from '@/lib/api-client';

export function UnsubscribeButton({ token }: { token: string }) {
  const [state, setState] = useState<'idle' | 'sending' | 'done' | 'error'>('idle');
  const [message, setMessage] = useState('');

  async function unsubscribe() {
    setState('sending');
    try {
      await apiSend('POST', '/api/notifications/unsubscribe', { token });
      setState('done');
    } catch (err) {
      setMessage(problemText(err, 'No connection to Vineward. Try again when you have signal.'));
      setState('error');
    }
  }

  if (state === 'done') {
    return (
      <Notice tone="ok">
        Done: no more daily digests. You can turn it on again under <Link href="/settings/notifications">notification settings</Link>.
      </Notice>
    );
  }
  return (
    <div className="flex flex-col gap-3">
      <Button type="button" size="large" onClick={() => void unsubscribe()} disabled={state === 'sending'}>
        {state === 'sending' ? 'Stopping…' : 'Stop the daily digest'}
      </Button>
      {state === 'error' && <Notice tone="error">{message}</Notice>}
    </div>
  );
}
