/** Where the app under test listens: set by `npm test` (scripts/run.mjs). */
export const APP_URL = process.env.APP_URL ?? "http://127.0.0.1:3100";
export const MAIL_API_URL = process.env.MAIL_API_URL ?? "http://127.0.0.1:2536";
export const DEMO_PASSWORD = process.env.DEMO_PASSWORD ?? "ondula-demo-2026";
