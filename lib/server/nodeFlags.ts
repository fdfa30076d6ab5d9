/**
 * Node flags for the `next start` process. `npm start` and the test and benchmark harness
 * (tests/ops/harness.ts) both start the server with them, so what is measured is what runs.
 * A server started some other way takes them through NODE_OPTIONS (README, "Scaling out").
 *
 * `--max-semi-space-size=32` (MiB; Node 20's default is 16): V8's young generation holds
 * objects until they survive two scavenges, after which they move to the old generation.
 * At 32 connections a notebook read lives 45–70 ms, while the default young generation
 * filled every 35–40 ms under that load, so each in-flight request's objects were promoted,
 * the old generation filled with garbage to 550–780 MiB, and each full collection that
 * followed (about 150 ms of incremental marking and a 15–25 ms pause) showed as the slowest
 * 1 % of responses. Measured on the 2-core development machine (2026-12-02, notebook reads at
 * 32 connections, 3 × 8 s per server, six servers each way): with 32 MiB the scavenges halve
 * (263–272 against 485–536), the full collections halve (1 against 2), the total GC pause
 * falls by about 12 %, and p99 was under 100 ms in 8 of 10 steady runs against 5 of 10. The
 * cost is up to 3 × 32 MiB more young-generation memory.
 */
export const SERVER_NODE_FLAGS: readonly string[] = ["--max-semi-space-size=32"];
