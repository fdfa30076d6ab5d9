/**
 * Runs once when the server starts (Next.js instrumentation hook): the compute pool's worker
 * threads start loading the engine now, so the first notebook computation does not wait for them.
 */
export async function register(): Promise<void> {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  const { computePool } = await import("./lib/server/compute/pool");
  computePool().warm();
}
