/**
 * An e-mail address that wraps where a reader expects it to — before the "@" and after the dots
 * of the domain — rather than letter by letter in a narrow column.
 */
export function EmailAddress({ email }: { email: string }) {
  const at = email.lastIndexOf("@");
  if (at <= 0) return <span className="[overflow-wrap:anywhere]">{email}</span>;
  const local = email.slice(0, at);
  const domain = email.slice(at + 1).split(".");
  return (
    <span className="[overflow-wrap:anywhere]" title={email}>
      {local}
      <wbr />@
      {domain.map((part, i) => (
        <span key={i}>
          {i > 0 ? (
            <>
              .<wbr />
            </>
          ) : null}
          {part}
        </span>
      ))}
    </span>
  );
}
