/** readArchive decompresses with an output limit: an archive that inflates past it (a gzip bomb) is refused, not read into memory. */
import { describe, it, expect } from "vitest";
import { gzipSync } from "node:zlib";
import { readArchive, MAX_ARCHIVE_BYTES } from "../../lib/server/backup/restoreGroup";
import { InputError } from "../../lib/engine/errors";

describe("backup decompression limit", () => {
  it("readArchive refuses an archive that inflates past the limit with InputError on field archive", () => {
    // 64 MiB of zeros compress to about 64 kB: 1000 times the limit given here.
    const bomb = gzipSync(Buffer.alloc(64 * 1024 * 1024));
    expect(bomb.byteLength).toBeLessThan(200 * 1024);
    let err: unknown;
    try {
      readArchive(bomb, 1024 * 1024);
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(InputError);
    expect((err as InputError).message).toBe("the archive decompresses to more than 1 MiB: refused (field archive)");
  });

  it("readArchive under the limit reads on (and finds what is wrong with the content, not the size)", () => {
    expect(() => readArchive(gzipSync(Buffer.from('{"format":"other"}\n')), 1024 * 1024)).toThrow(/not a Heatbook group backup/);
  });

  it("the default limit stays below the longest string JavaScript can hold", () => {
    expect(MAX_ARCHIVE_BYTES).toBeLessThanOrEqual(0x1fffffe8);
  });
});
