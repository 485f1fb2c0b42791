"use client";

export default function AccountError({ reset }: { error: Error; reset: () => void }) {
  return (
    <div className="mx-auto max-w-xl px-gutter py-20">
      <h1 className="text-2xl font-semibold">This page could not be shown</h1>
      <p className="mt-3 text-graphite">Nothing you saved is lost. Try again; if it keeps happening, reload the page.</p>
      <button type="button" onClick={() => reset()} className="mt-6 rounded-card border border-ink/30 px-4 py-2 font-semibold hover:bg-paper-deep">
        Try again
      </button>
    </div>
  );
}
