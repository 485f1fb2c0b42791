"use server";

import { z } from "zod";
import { changeRole, changeStatus } from "@/server/accounts/admin";
import { ROLES } from "@/lib/auth/types";
import { defineAction } from "@/server/http/action";

const userId = z.string().uuid("Not a valid account id.");

export const setRoleAction = defineAction({
  name: "setRole",
  schema: z.object({ userId, role: z.enum(ROLES, { message: "Choose a role." }) }),
  run: async ({ input, user }) => {
    const row = await changeRole(user, input);
    return { message: `${row.name} is now ${input.role === "admin" ? "an admin" : `a ${input.role}`}.`, revalidate: ["/admin/users"] };
  },
});

export const setStatusAction = defineAction({
  name: "setStatus",
  schema: z.object({ userId, status: z.enum(["active", "disabled"]) }),
  run: async ({ input, user }) => {
    const row = await changeStatus(user, input);
    return {
      message: input.status === "disabled" ? `${row.name} is disabled and signed out everywhere.` : `${row.name} can sign in again.`,
      revalidate: ["/admin/users"],
    };
  },
});
