/** Audit actions in words, for the group's activity list. */
const PHRASES: Record<string, string> = {
  "group.create": "created the group",
  "group.settings": "changed the group settings",
  "member.invite": "invited",
  "member.invite.revoke": "revoked an invitation",
  "member.join": "joined the group",
  "member.role": "changed a member's role",
  "member.remove": "removed a member",
  "member.leave": "left the group",
  "sample.create": "added sample",
  "sample.update": "edited sample",
  "sample.archive": "archived sample",
  "sample.restore": "restored sample",
  "measurement.import": "stored measurement",
};

/** "added sample", "stored measurement", or the raw action name for anything not listed. */
export function describeAction(action: string): string {
  return PHRASES[action] ?? action.replace(/\./g, " ");
}
