-- Two rules better-auth checks only in application code, made the database's own:
--   member_role_is_ours / invitation_role_is_ours: a role is exactly one of our five. better-auth
--     stores ["observer","owner"] as "observer,owner" and also accepts its own "admin" and "member".
--   team_keeps_an_owner: no committed change leaves an existing Team without an Owner. better-auth
--     counts the Owners and then writes in separate statements, so two Owners demoting each other,
--     or leaving, at the same moment both pass its check.
--
-- The CHECK constraints are not declared with check() in db/schema/auth.ts: that file is written
-- by better-auth's schema generator, a regeneration would drop them from the schema, and the next
-- drizzle-kit generate would then write a migration dropping them from the database. They live
-- here, with the trigger, which Drizzle cannot express anyway.

-- Rows written before these rules. A member whose role list held "owner" was an Owner to
-- better-auth (it matches any element); where taking the first element would leave their Team
-- without an Owner, the earliest such member becomes a plain Owner, so the mapping below cannot
-- itself break the rule it introduces. No one gains a right they did not already have.
UPDATE "member" AS m
SET "role" = 'owner'
WHERE m."id" IN (
  SELECT DISTINCT ON (c."organization_id") c."id"
  FROM "member" AS c
  WHERE c."role" ~ '(^|,)\s*owner\s*(,|$)'
    AND NOT EXISTS (
      SELECT 1 FROM "member" AS o
      WHERE o."organization_id" = c."organization_id" AND btrim(split_part(o."role", ',', 1)) = 'owner'
    )
  ORDER BY c."organization_id", c."created_at", c."id"
);
--> statement-breakpoint
-- The first element when it is one of ours (better-auth trims around commas); anything else,
-- better-auth's "admin" and "member" included, becomes the least a member can do.
UPDATE "member"
SET "role" = CASE
  WHEN btrim(split_part("role", ',', 1)) IN ('owner', 'lead', 'engineer', 'reviewer', 'observer')
    THEN btrim(split_part("role", ',', 1))
  ELSE 'observer'
END
WHERE "role" NOT IN ('owner', 'lead', 'engineer', 'reviewer', 'observer');
--> statement-breakpoint
-- An invitation without a role would create a member without one on acceptance: observer too.
UPDATE "invitation"
SET "role" = CASE
  WHEN btrim(split_part("role", ',', 1)) IN ('owner', 'lead', 'engineer', 'reviewer', 'observer')
    THEN btrim(split_part("role", ',', 1))
  ELSE 'observer'
END
WHERE "role" IS NULL OR "role" NOT IN ('owner', 'lead', 'engineer', 'reviewer', 'observer');
--> statement-breakpoint
ALTER TABLE "member" ADD CONSTRAINT "member_role_is_ours"
  CHECK ("role" IN ('owner', 'lead', 'engineer', 'reviewer', 'observer'));
--> statement-breakpoint
-- A CHECK passes on NULL; the column is nullable in better-auth's schema, so say it here.
ALTER TABLE "invitation" ADD CONSTRAINT "invitation_role_is_ours"
  CHECK ("role" IS NOT NULL AND "role" IN ('owner', 'lead', 'engineer', 'reviewer', 'observer'));
--> statement-breakpoint
-- Runs at commit, not before each row: better-auth deletes a Team by deleting its members first
-- and the organization row last, so at the moment the last Owner's row goes the Team still
-- exists; by commit it is gone and the Team's deletion passes. (That needs the three deletes in
-- one transaction: the drizzle adapter's `transaction: true`.) Checking the state at commit also
-- lets one transaction hand a Team over in either order: demote A, then promote B.
CREATE FUNCTION "team_keeps_an_owner"() RETURNS trigger
LANGUAGE plpgsql
SET search_path = public
AS $$
BEGIN
  -- Locking the Team's row makes the checks of one Team's changes wait for each other. The
  -- weaker NO KEY UPDATE lock is enough for that and, unlike FOR UPDATE, does not hold up
  -- inserts whose foreign keys point at the Team (members, reviews, activity).
  PERFORM 1 FROM "organization" WHERE "id" = OLD."organization_id" FOR NO KEY UPDATE;
  IF NOT FOUND THEN
    -- The Team itself was deleted (in this transaction, or by one we waited for).
    RETURN NULL;
  END IF;
  -- Under READ COMMITTED this statement takes a new snapshot after the lock was granted, so it
  -- sees what a concurrent transaction that held the lock has committed.
  IF NOT EXISTS (
    SELECT 1 FROM "member" WHERE "organization_id" = OLD."organization_id" AND "role" = 'owner'
  ) THEN
    RAISE EXCEPTION 'A Team must keep at least one Owner.'
      USING ERRCODE = 'check_violation', CONSTRAINT = 'team_keeps_an_owner', TABLE = 'member',
            SCHEMA = 'public';
  END IF;
  RETURN NULL;
END;
$$;
--> statement-breakpoint
-- Only changes that take an Owner away fire it. An INSERT cannot; moving a member row to another
-- Team is refused outright (below), so OLD."organization_id" is the only Team to check.
CREATE CONSTRAINT TRIGGER "team_keeps_an_owner"
AFTER UPDATE OF "role" OR DELETE ON "member"
DEFERRABLE INITIALLY DEFERRED
FOR EACH ROW
WHEN (OLD."role" = 'owner')
EXECUTE FUNCTION "team_keeps_an_owner"();
--> statement-breakpoint
-- Nothing in better-auth moves a membership between Teams; a move would take an Owner from one
-- Team without the rule above seeing it as a removal.
CREATE FUNCTION "member_stays_in_its_team"() RETURNS trigger
LANGUAGE plpgsql
AS $$
BEGIN
  RAISE EXCEPTION 'A membership cannot move to another Team.'
    USING ERRCODE = 'check_violation', CONSTRAINT = 'member_stays_in_its_team', TABLE = 'member',
          SCHEMA = 'public';
END;
$$;
--> statement-breakpoint
CREATE TRIGGER "member_stays_in_its_team"
BEFORE UPDATE OF "organization_id" ON "member"
FOR EACH ROW
WHEN (NEW."organization_id" IS DISTINCT FROM OLD."organization_id")
EXECUTE FUNCTION "member_stays_in_its_team"();
