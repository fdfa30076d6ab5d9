/**
 * The role table: the one place that says which role may do what. Every route handler and
 * server action checks it on the server (through `requireRole` in access.ts).
 */
export type Role = "owner" | "analyst" | "reviewer" | "viewer";

export const ROLES: readonly Role[] = ["owner", "analyst", "reviewer", "viewer"];

export type Action =
  | "group.read"
  | "group.manage" // rename, settings, members, roles, invitations
  | "sample.write"
  | "measurement.write"
  | "analysis.write"
  | "analysis.submit"
  | "analysis.review"
  | "comment.write"
  | "series.write"
  | "token.create"
  | "audit.read"
  | "backup.export";

const TABLE: Record<Action, readonly Role[]> = {
  "group.read": ["owner", "analyst", "reviewer", "viewer"],
  "group.manage": ["owner"],
  "sample.write": ["owner", "analyst"],
  "measurement.write": ["owner", "analyst"],
  "analysis.write": ["owner", "analyst"],
  "analysis.submit": ["owner", "analyst"],
  "analysis.review": ["owner", "reviewer"],
  "comment.write": ["owner", "analyst", "reviewer"],
  "series.write": ["owner", "analyst"],
  "token.create": ["owner", "analyst", "reviewer", "viewer"],
  "audit.read": ["owner"],
  "backup.export": ["owner"],
};

export function can(role: Role, action: Action): boolean {
  return TABLE[action].includes(role);
}

/** The table itself, for the members page and the authorization tests. */
export function permissionTable(): Record<Action, readonly Role[]> {
  return TABLE;
}

export function isRole(value: unknown): value is Role {
  return typeof value === "string" && (ROLES as readonly string[]).includes(value);
}
