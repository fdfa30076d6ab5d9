import { describe, expect, it } from "vitest";
import { spawnSync } from "node:child_process";
import { SERVER_NODE_FLAGS } from "@/lib/server/nodeFlags";

const execArgvOf = (args: string[], env: NodeJS.ProcessEnv = process.env) =>
  spawnSync(process.execPath, [...args, "-e", "process.stdout.write(JSON.stringify([process.execArgv, process.env.NODE_OPTIONS ?? null]))"], { env, encoding: "utf8" });

describe("SERVER_NODE_FLAGS", () => {
  it("are accepted by this Node as arguments, as `npm start` and the harness pass them", () => {
    const r = execArgvOf([...SERVER_NODE_FLAGS]);
    expect(r.stderr).toBe("");
    expect(r.status).toBe(0);
    expect(JSON.parse(r.stdout)[0].slice(0, SERVER_NODE_FLAGS.length)).toEqual([...SERVER_NODE_FLAGS]);
  });

  it("are accepted in NODE_OPTIONS, as the README tells a server started some other way", () => {
    const r = execArgvOf([], { ...process.env, NODE_OPTIONS: SERVER_NODE_FLAGS.join(" ") });
    expect(r.stderr).toBe("");
    expect(r.status).toBe(0);
    expect(JSON.parse(r.stdout)[1]).toBe(SERVER_NODE_FLAGS.join(" "));
  });

  it("are refused by Node when misspelt, so the two checks above can fail", () => {
    const r = execArgvOf(["--max-semi-space-sise=32"]);
    expect(r.status).not.toBe(0);
    expect(r.stderr).toContain("bad option");
  });
});
