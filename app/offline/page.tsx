import type { Metadata } from 'next';
import { Wordmark } from '@/components/layout/logo';

export const metadata: Metadata = { title: 'Offline' };

export default function OfflinePage() {
  return (
    <main className="mx-auto flex max-w-md flex-col gap-4 p-6">
      <Wordmark />
      <h1 className="text-2xl font-extrabold">No signal, and this page was not opened before</h1>
      <p>Everything you recorded is kept on this phone and will be sent when you are back in range. Pages you opened while online work offline.</p>
      <p lang="es">
        Sin señal, y esta página no se abrió antes. Todo lo que registró queda guardado en este teléfono y se enviará cuando vuelva a tener cobertura.
      </p>
      <a href="/field" className="inline-flex min-h-touch items-center justify-center rounded-lg bg-rootstock px-5 font-bold text-white no-underline">
        Field / Campo
      </a>
    </main>
  );
}
