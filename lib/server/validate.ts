/** zod → InputError naming the field, the one way payloads are validated on the server. */
import type { z } from "zod";
import { InputError } from "../engine/errors";

export function parseInput<S extends z.ZodType>(schema: S, input: unknown): z.infer<S> {
  const parsed = schema.safeParse(input);
  if (parsed.success) return parsed.data;
  const issue = parsed.error.issues[0]!;
  const field = issue.path.map(String).join(".");
  throw new InputError(issue.message, field ? { field } : undefined);
}
