-- Step outputs are written whole and read whole, never queried inside: keep them as `json`
-- (the text as written, only checked to be JSON) instead of `jsonb` (parsed into a binary tree
-- with every number converted to numeric on the way in and back to text on the way out), and
-- store them uncompressed out of line (STORAGE EXTERNAL), so a recompute does not spend its
-- time compressing a few hundred kilobytes. Measured on the development machine for a 300 kB
-- output: jsonb write 18.5 ms and read 8.1 ms; json EXTERNAL write 5.7 ms and read 4.3 ms
-- (bench notes in DEVELOPERS.md). Costs about 2–3× the disk for these rows.
ALTER TABLE "Step" ALTER COLUMN "output" TYPE JSON USING "output"::json;
ALTER TABLE "Step" ALTER COLUMN "output" SET STORAGE EXTERNAL;
