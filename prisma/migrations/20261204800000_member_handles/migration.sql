-- Every member of a group has a handle for @mentions, unique within the group: the first word
-- of the display name in lower-case letters and digits (else the e-mail's name part), with 2, 3 …
-- appended when another member of the group already has it. Set by a trigger when an insert
-- leaves it empty, so every way of adding a member gets one.

CREATE FUNCTION heatbook_member_handle(p_user uuid, p_group uuid) RETURNS text
LANGUAGE plpgsql AS $$
DECLARE
  base text;
  candidate text;
  n int := 1;
BEGIN
  SELECT lower(regexp_replace(split_part(trim(u.name), ' ', 1), '[^A-Za-z0-9]', '', 'g')),
         lower(regexp_replace(split_part(u.email, '@', 1), '[^A-Za-z0-9]', '', 'g'))
    INTO base, candidate FROM "User" u WHERE u.id = p_user;
  IF base IS NULL OR base = '' THEN base := coalesce(nullif(candidate, ''), 'member'); END IF;
  base := left(base, 30);
  candidate := base;
  WHILE EXISTS (SELECT 1 FROM "Membership" m WHERE m."groupId" = p_group AND m."handle" = candidate) LOOP
    n := n + 1;
    candidate := base || n::text;
  END LOOP;
  RETURN candidate;
END $$;

ALTER TABLE "Membership" ADD COLUMN "handle" TEXT NOT NULL DEFAULT '';

DO $$
DECLARE r record;
BEGIN
  FOR r IN SELECT id, "userId", "groupId" FROM "Membership" ORDER BY "createdAt", id LOOP
    UPDATE "Membership" SET "handle" = heatbook_member_handle(r."userId", r."groupId") WHERE id = r.id;
  END LOOP;
END $$;

CREATE FUNCTION heatbook_membership_handle_fill() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
  IF NEW."handle" IS NULL OR NEW."handle" = '' THEN
    NEW."handle" := heatbook_member_handle(NEW."userId", NEW."groupId");
  END IF;
  RETURN NEW;
END $$;

CREATE TRIGGER "Membership_handle_fill" BEFORE INSERT ON "Membership"
  FOR EACH ROW EXECUTE FUNCTION heatbook_membership_handle_fill();

CREATE UNIQUE INDEX "Membership_groupId_handle_key" ON "Membership"("groupId", "handle");
