/**
 * An error as a player reads it, with what an engineer needs (the code, element names, the HTTP
 * status) one click away behind "Details", never in the message itself.
 */
export function ErrorDetails({ technical }: { technical: string | null | undefined }) {
  if (!technical) return null;
  return (
    <details className="mt-1 text-xs text-graphite">
      <summary className="inline-flex min-h-6 cursor-pointer items-center">Details</summary>
      <p className="mt-1 break-words font-mono">{technical}</p>
    </details>
  );
}
