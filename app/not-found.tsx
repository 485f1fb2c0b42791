import Link from "next/link";

export default function NotFound() {
  return (
    <div className="mx-auto max-w-xl px-gutter py-20">
      <h1 className="text-2xl font-semibold">Not found</h1>
      <p className="mt-3 text-graphite">This page does not exist, or you do not have access to it.</p>
      <Link href="/" className="mt-6 inline-block text-accent underline">Back to the start</Link>
    </div>
  );
}
