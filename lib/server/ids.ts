/** Record ids are UUIDs; text that is not one names no row. */

/** Whether `id` has the form of a UUID (any version, either case). */
export function isUuid(id: string): boolean {
  return /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i.test(id);
}

/** Ids that are not UUIDs cannot exist; map them to a UUID no row has, so the query finds nothing. */
export function uuidOrNone(id: string): string {
  return isUuid(id) ? id : "00000000-0000-0000-0000-000000000000";
}
