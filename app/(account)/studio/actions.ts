"use server";

import { z } from "zod";
import { inviteToStudio, joinStudio, leaveStudio, removeMember } from "@/server/accounts/studio";
import { defineAction } from "@/server/http/action";

export const inviteAction = defineAction({
  name: "inviteToStudio",
  keep: ["email"],
  schema: z.object({ email: z.string().trim().max(320).email("Enter a valid e-mail address.") }),
  run: async ({ input, user }) => {
    await inviteToStudio(user, input);
    return { message: `Invitation sent to ${input.email}.`, revalidate: ["/studio"] };
  },
});

export const removeMemberAction = defineAction({
  name: "removeMember",
  schema: z.object({ playerId: z.string().uuid() }),
  run: async ({ input, user }) => {
    await removeMember(user, input);
    return { message: "Removed from your studio.", revalidate: ["/studio"] };
  },
});

export const leaveStudioAction = defineAction({
  name: "leaveStudio",
  schema: z.object({ studioId: z.string().uuid() }),
  run: async ({ input, user }) => {
    await leaveStudio(user, input);
    return { message: "You left the studio.", revalidate: ["/studio"] };
  },
});

export const joinStudioAction = defineAction({
  name: "joinStudio",
  schema: z.object({ token: z.string().min(1).max(200) }),
  run: async ({ input, user }) => {
    await joinStudio(user, input);
    return { redirectTo: "/studio?joined=1" };
  },
});
