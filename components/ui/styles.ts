/** Class lists shared by server and client components (a client module's exports are not usable as values on the server). */
export const fieldClass =
  "w-full rounded-card border border-graphite/60 bg-paper-card px-3 py-2 text-ink placeholder:text-graphite/70 aria-[invalid=true]:border-danger";

export const inputClass = `${fieldClass} appearance-none`;
export const selectClass = `${fieldClass} py-1.5`;
