/**
 * POST /api/v1/samples/{id}/measurements: multipart (file + options JSON, exactly the app's import)
 * or the raw file as the body with query parameters (for scripts). Both end in importMeasurement.
 */
import type { z } from "zod";
import type { Db } from "../db/client";
import { InputError } from "../../engine/errors";
import type { Member } from "../access";
import { readUpload } from "../handler";
import { readBodyLimited } from "../body";
import { decodeText, importMeasurement, MAX_UPLOAD_BYTES, type MeasurementInfo } from "../measurements";
import { resolveColumns } from "./columns";
import type { rawUploadQuery } from "./schemas";

/** The raw body, counted as it arrives (413 beyond the upload limit). */
const rawBytes = (req: Request): Promise<Uint8Array> => readBodyLimited(req, MAX_UPLOAD_BYTES, "upload", "file");

/** Store the uploaded measurement; see the module comment for the two forms. */
export async function uploadMeasurement(req: Request, db: Db, member: Member, sampleId: string, query: z.infer<typeof rawUploadQuery>): Promise<MeasurementInfo> {
  const type = (req.headers.get("content-type") ?? "").toLowerCase();
  if (type.startsWith("multipart/form-data")) {
    const upload = await readUpload(req);
    return importMeasurement(db, member, sampleId, upload.fileName, upload.bytes, upload.fields);
  }
  if (type && !/^(text\/plain|text\/csv|text\/tab-separated-values|application\/octet-stream)\b/.test(type)) {
    throw new InputError(`unsupported Content-Type ${JSON.stringify(type)}: send multipart/form-data or the raw file as text/plain`, { field: "file" });
  }
  const bytes = await rawBytes(req);
  if (bytes.byteLength === 0) throw new InputError("the request body is empty: send the file", { field: "file" });
  const resolved = resolveColumns(decodeText(bytes), query.fileName, query);
  const options = {
    kind: query.kind, label: query.label ?? query.fileName, mapping: resolved.mapping, units: resolved.units, parse: resolved.parse,
    ...(query.fieldT !== undefined ? { fieldT: query.fieldT } : {}),
  };
  return importMeasurement(db, member, sampleId, query.fileName, bytes, options);
}
