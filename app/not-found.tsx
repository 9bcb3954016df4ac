import Link from "next/link";

export default function NotFound() {
  return (
    <main className="mx-auto max-w-lg px-6 py-24 text-center">
      <h1>Not found</h1>
      <p className="mt-2 text-sm text-ink-soft" data-testid="not-found">
        There is nothing here, or it belongs to a lab you are not a member of.
      </p>
      <p className="mt-4 text-sm">
        <Link href="/">Back to your labs</Link>
      </p>
    </main>
  );
}
