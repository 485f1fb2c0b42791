import Link from "next/link";

export default function PartNotFound() {
  return (
    <div className="mx-auto max-w-xl px-gutter py-16">
      <h1 className="text-2xl font-semibold">This part is not here</h1>
      <p className="mt-3 text-graphite">It may have been deleted, or it has not been shared with you (or no longer is).</p>
      <Link href="/parts" className="mt-6 inline-block text-accent-strong underline">Back to your parts</Link>
    </div>
  );
}
