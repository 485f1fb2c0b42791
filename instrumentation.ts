/**
 * Runs once when the server starts: the configuration is checked at once, so a production server
 * with a missing or development secret stops instead of serving.
 */
export async function register() {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  const { config, ConfigError } = await import("@/lib/config");
  try {
    config();
  } catch (error) {
    if (error instanceof ConfigError) {
      console.error(error.message);
      process.exit(1);
    }
    throw error;
  }
  await stampPeerAddresses();
  // Sends the mail queued by requests (the outbox), with retries; see server/outbox/worker.ts.
  const { startOutboxWorker } = await import("@/server/outbox/worker");
  await startOutboxWorker();
}

/** Client addresses come from the socket (lib/http/peer-address.ts); stamped before any request is answered. */
async function stampPeerAddresses() {
  const [http, { stampPeerAddresses: stamp }] = await Promise.all([import("node:http"), import("@/lib/http/peer-address")]);
  stamp(http);
}
