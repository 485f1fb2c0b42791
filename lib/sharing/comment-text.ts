/** Longest comment, reply or proposal note we keep (characters, after normalizing). */
export const COMMENT_MAX_LENGTH = 4000;

/**
 * Comments are plain text: we never interpret markup, we only keep what a person typed readable.
 * Windows and old-Mac line ends become "\n", control characters other than tab and newline are
 * dropped, trailing spaces on each line go, more than two blank lines in a row collapse to two,
 * and blank lines at the start and end are trimmed.
 */
export function normalizeCommentText(input: string): string {
  return input
    .replace(/\r\n?/g, "\n")
    .replace(/[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F]/g, "")
    .split("\n")
    .map((line) => line.replace(/[ \t]+$/, ""))
    .join("\n")
    .replace(/\n{4,}/g, "\n\n\n")
    .trim();
}

/** A one-line excerpt for notifications and e-mail subjects. */
export function excerpt(text: string, max = 80): string {
  const flat = text.replace(/\s+/g, " ").trim();
  return flat.length <= max ? flat : `${flat.slice(0, max - 1).trimEnd()}…`;
}
