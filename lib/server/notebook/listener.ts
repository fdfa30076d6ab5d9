/**
 * One LISTEN connection per app process, fanned out to the open event streams of that process.
 * Reconnects with back-off when PostgreSQL goes away; subscribers are kept meanwhile.
 */
import pg from "pg";
import { EVENT_CHANNEL, type NotebookEvent } from "./events";

type Subscriber = (e: NotebookEvent) => void;

const subscribers = new Set<Subscriber>();
let client: pg.Client | null = null;
let connecting: Promise<void> | null = null;
let retryMs = 250;

async function connect(): Promise<void> {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error("DATABASE_URL is not set");
  const c = new pg.Client({ connectionString: url });
  c.on("notification", (msg) => {
    if (msg.channel !== EVENT_CHANNEL || !msg.payload) return;
    let event: NotebookEvent;
    try {
      event = JSON.parse(msg.payload) as NotebookEvent;
    } catch {
      return;
    }
    for (const s of subscribers) s(event);
  });
  const reconnect = () => {
    if (client !== c) return;
    client = null;
    setTimeout(() => void ensure().catch(() => undefined), retryMs);
    retryMs = Math.min(retryMs * 2, 5000);
  };
  c.on("error", reconnect);
  c.on("end", reconnect);
  await c.connect();
  await c.query(`LISTEN ${EVENT_CHANNEL}`);
  client = c;
  retryMs = 250;
}

async function ensure(): Promise<void> {
  if (client) return;
  if (!connecting) connecting = connect().finally(() => { connecting = null; });
  try {
    await connecting;
  } catch {
    setTimeout(() => void ensure().catch(() => undefined), retryMs);
    retryMs = Math.min(retryMs * 2, 5000);
  }
}

/** Receive every event of this process's database; returns the unsubscribe function. */
export async function subscribe(fn: Subscriber): Promise<() => void> {
  subscribers.add(fn);
  await ensure();
  return () => subscribers.delete(fn);
}
