"use client";

export default function PartsError({ error, reset }: { error: Error; reset: () => void }) {
  return (
    <div role="alert" className="mx-auto max-w-xl px-gutter py-12">
      <h1 className="text-xl font-semibold">Your parts could not be shown</h1>
      <p className="mt-2 text-graphite">{error.message || "Something went wrong."} Your parts are safe.</p>
      <button onClick={reset} className="mt-4 rounded-card border border-ink/30 px-4 py-2">Try again</button>
    </div>
  );
}
