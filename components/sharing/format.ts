const dateTime = new Intl.DateTimeFormat("en-GB", { dateStyle: "medium", timeStyle: "short" });

export function formatWhen(iso: string): string {
  return dateTime.format(new Date(iso));
}

export const PERMISSION_LABEL = {
  comment: "Comment",
  propose: "Comment and propose",
} as const;
