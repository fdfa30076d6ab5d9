/**
 * Server-sent events for live pages: every notebook change in the caller's group, as it commits
 * anywhere (PostgreSQL LISTEN/NOTIFY, so it crosses app instances). A comment line every 20 s
 * keeps proxies from closing the stream.
 */
import { route } from "@/lib/server/http";
import { inGroup } from "@/lib/server/handler";
import { subscribe } from "@/lib/server/notebook/listener";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ slug: string }> };

export const GET = route(async (req, { params }: Ctx) => {
  const { member } = await inGroup(req, (await params).slug);
  const url = new URL(req.url);
  const analysisId = url.searchParams.get("analysisId");
  // ?once=1: answer with the opening comment and close (a cheap reachability probe for scripts).
  if (url.searchParams.get("once") === "1") return new Response(": connected\n\n", { headers: { "content-type": "text/event-stream" } });
  const encoder = new TextEncoder();
  let cleanup = () => {};
  const stream = new ReadableStream<Uint8Array>({
    async start(controller) {
      const send = (text: string) => {
        try {
          controller.enqueue(encoder.encode(text));
        } catch {
          cleanup();
        }
      };
      const unsubscribe = await subscribe((e) => {
        if (e.groupId !== member.group.id || (analysisId && e.analysisId !== analysisId)) return;
        // Progress of a long computation is its own event, so pages do not re-read the notebook on it.
        send(`event: ${e.kind === "computing" ? "progress" : "change"}\ndata: ${JSON.stringify(e)}\n\n`);
      });
      const ping = setInterval(() => send(": ping\n\n"), 20_000);
      cleanup = () => {
        clearInterval(ping);
        unsubscribe();
      };
      req.signal.addEventListener("abort", () => {
        cleanup();
        try {
          controller.close();
        } catch {
          /* already closed */
        }
      });
      send(": connected\n\n");
    },
    cancel() {
      cleanup();
    },
  });
  return new Response(stream, { headers: { "content-type": "text/event-stream", "cache-control": "no-cache, no-transform", connection: "keep-alive" } });
});
