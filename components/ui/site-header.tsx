import Link from "next/link";

export function SiteHeader() {
  return (
    <header className="no-print border-b border-rule bg-paper">
      <nav aria-label="Main" className="mx-auto flex max-w-6xl items-center gap-6 px-gutter py-3">
        <Link href="/" className="font-serif text-xl font-semibold tracking-tight">
          Ondula
        </Link>
        <Link href="/parts" className="text-graphite hover:text-ink">Parts</Link>
        <Link href="/studio" className="text-graphite hover:text-ink">Studio</Link>
        <span className="ml-auto" />
        <Link href="/sign-in" className="text-graphite hover:text-ink">Sign in</Link>
      </nav>
    </header>
  );
}
