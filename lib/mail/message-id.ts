/**
 * The Message-ID of a queued message, made from its job's id: the same on every attempt, so a
 * receiver (or a person) can recognise a copy sent twice when an attempt was delivered but not
 * recorded. Form: `<id-left@id-right>` (RFC 5322 §3.6.4), the right side the app's host name.
 */
export function messageIdFor(jobId: string, appUrl: string): string {
  const host = new URL(appUrl).hostname.replace(/^\[|\]$/g, "");
  return `<${jobId}@${/^[A-Za-z0-9.-]+$/.test(host) ? host : "ondula.invalid"}>`;
}
