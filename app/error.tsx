"use client";

export default function ErrorPage({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <main className="mx-auto max-w-lg px-6 py-24 text-center">
      <h1>Something went wrong</h1>
      <p className="mt-2 text-sm text-ink-soft">
        The page could not be shown{error.digest ? ` (reference ${error.digest})` : ""}. Nothing you entered was saved by this failure.
      </p>
      <button type="button" onClick={reset} className="mt-4 rounded-md border border-ink-line px-3 py-1.5 text-sm">
        Try again
      </button>
    </main>
  );
}
