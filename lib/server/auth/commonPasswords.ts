/**
 * The list of common passwords: @zxcvbn-ts/language-common's "passwords-common" dictionary
 * (about 49 000 entries, most frequent first, maintained with zxcvbn-ts). Compared lower-cased.
 */
import { dictionary } from "@zxcvbn-ts/language-common";

let set: Set<string> | undefined;

export function isCommonPassword(password: string): boolean {
  set ??= new Set((dictionary["passwords-common"] as string[]).map((p) => p.toLowerCase()));
  return set.has(password.toLowerCase());
}
