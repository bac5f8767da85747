import Link from 'next/link';

export default function NotFound() {
  return (
    <main className="mx-auto max-w-md p-8">
      <h1 className="text-2xl font-extrabold">Not found</h1>
      <p className="mt-2">There is nothing at this address, or it belongs to another organisation.</p>
      <Link href="/" className="mt-4 inline-block font-bold text-rootstock underline">
        Back to Vineward
      </Link>
    </main>
  );
}
