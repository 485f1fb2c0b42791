export default function Loading() {
  return <p className="mx-auto max-w-6xl px-gutter py-8 text-graphite">Loading your parts…</p>;
}
