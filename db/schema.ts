export * from "./schema/auth";
export * from "./schema/parts";
export * from "./schema/sharing";
export * from "./schema/practice";
export * from "./schema/requests";
