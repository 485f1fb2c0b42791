"use server";

import { z } from "zod";
import { updateProfile } from "@/server/accounts/profile";
import { changePassword } from "@/server/accounts/registration";
import { newPasswordSchema } from "@/lib/auth/password-rules";
import { assertCan } from "@/lib/auth/policy";
import { defineAction, formCheckbox } from "@/server/http/action";

export const updateProfileAction = defineAction({
  name: "updateProfile",
  keep: ["name"],
  schema: z.object({
    name: z.string().trim().min(1, "Enter your name.").max(80, "Use at most 80 characters."),
    emailNotifications: formCheckbox,
  }),
  run: async ({ input, user }) => {
    await updateProfile(user, input);
    return { message: "Saved.", revalidate: ["/settings"] };
  },
});

/** A new password ends every session, this one included: the person signs in again. */
export const changePasswordAction = defineAction({
  name: "changePassword",
  schema: z
    .object({ current: z.string().min(1, "Enter your current password."), next: newPasswordSchema, confirm: z.string() })
    .refine((v) => v.next === v.confirm, { message: "The two passwords differ.", path: ["confirm"] }),
  run: async ({ input, user }) => {
    assertCan(user, "account:edit", { type: "account", account: { id: user.id } });
    await changePassword(user, { current: input.current, next: input.next });
    return { redirectTo: "/sign-in?changed=1&callbackUrl=/settings" };
  },
});
