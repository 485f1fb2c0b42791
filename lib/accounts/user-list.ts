/** The columns the admin's account table sorts by. */
export const USER_SORTS = ["name", "email", "role", "status", "created"] as const;
export type UserSort = (typeof USER_SORTS)[number];
