/** Note step: Markdown text in the chain (rendered and sanitised by the page, never executed). */
import { z } from "zod";
import { defineStep } from "./shared";

export const noteConfig = z.object({ markdown: z.string().max(50_000).default("") });
export type NoteConfig = z.infer<typeof noteConfig>;

export const noteStep = defineStep({
  kind: "note",
  title: "Note",
  schema: noteConfig,
  initial: { markdown: "" },
  dependencies: () => ({ measurementIds: [], sampleFields: [] }),
  compute: (config, state) => ({ result: { markdown: config.markdown }, warnings: [], state }),
});
