/** `npm run lint`: the import boundaries (lib/dev/boundaries.ts); exit 1 with each finding. */
import { checkBoundaries, formatFinding } from "../lib/dev/boundaries";

const found = checkBoundaries(process.cwd());
for (const f of found) console.error(formatFinding(f));
console.log(found.length ? `${found.length} boundary finding${found.length > 1 ? "s" : ""}` : "import boundaries: ok");
process.exit(found.length ? 1 : 0);
