import "server-only";
import { redirect } from "next/navigation";
import { getCurrentUser } from "./session";
import type { CurrentUser } from "@/lib/auth/types";

/** For pages: the signed-in user, or a redirect to sign-in that comes back here afterwards. */
export async function requirePageUser(path: string): Promise<CurrentUser> {
  const user = await getCurrentUser();
  if (!user) redirect(`/sign-in?callbackUrl=${encodeURIComponent(path)}`);
  return user;
}
