'use client';

import { useEffect, useState } from 'react';
import { Notice } from '@/components/ui/field';
import { describeWaiting, waitingOnThisPhone, type Waiting } from '@/lib/shared-phone';

/** On a shared phone, tells whoever signs in next that someone's records still wait here. */
export function WaitingOnPhone() {
  const [waiting, setWaiting] = useState<Waiting>();
  useEffect(() => {
    waitingOnThisPhone().then(setWaiting, () => undefined);
  }, []);
  if (!waiting || waiting.records + waiting.photos === 0) return null;
  const { text, one } = describeWaiting(waiting);
  return (
    <div data-testid="waiting-on-phone" className="mb-4">
      <Notice tone="warn">
        {text} saved on this phone {one ? 'is' : 'are'} waiting to be sent. {one ? 'It goes' : 'They go'} out when the person who saved {one ? 'it' : 'them'}{' '}
        signs in here again.
      </Notice>
    </div>
  );
}
