/** Reading a server-sent-event stream in the ops tests: collects `event: change` payloads. */
export interface EventStream {
  events: { kind: string; stepId?: string; analysisId: string }[];
  close(): void;
}

export async function openEvents(url: string, cookie: string): Promise<EventStream> {
  const abort = new AbortController();
  const res = await fetch(url, { headers: { cookie, accept: "text/event-stream" }, signal: abort.signal });
  if (res.status !== 200 || !res.body) throw new Error(`event stream answered ${res.status}`);
  const events: EventStream["events"] = [];
  const reader = res.body.getReader();
  const decoder = new TextDecoder();
  let buffer = "";
  let connected: () => void = () => undefined;
  const ready = new Promise<void>((ok) => (connected = ok));
  void (async () => {
    try {
      for (;;) {
        const { value, done } = await reader.read();
        if (done) return;
        buffer += decoder.decode(value, { stream: true });
        let cut: number;
        while ((cut = buffer.indexOf("\n\n")) >= 0) {
          const block = buffer.slice(0, cut);
          buffer = buffer.slice(cut + 2);
          if (block.startsWith(": connected")) connected();
          const data = block.split("\n").find((l) => l.startsWith("data: "));
          if (block.startsWith("event: change") && data) events.push(JSON.parse(data.slice(6)));
        }
      }
    } catch {
      /* aborted */
    }
  })();
  await ready;
  return { events, close: () => abort.abort() };
}
