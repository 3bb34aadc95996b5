CREATE TABLE "machine_household_months" (
	"operation_id" uuid NOT NULL,
	"month" date NOT NULL,
	"machine_id" uuid NOT NULL,
	"household_id" uuid NOT NULL,
	"entries" integer NOT NULL,
	"hours" numeric(14, 2) NOT NULL,
	CONSTRAINT "machine_household_months_pkey" PRIMARY KEY("operation_id","month","machine_id","household_id"),
	CONSTRAINT "machine_household_months_month_check" CHECK (extract(day from "machine_household_months"."month") = 1)
);
--> statement-breakpoint
CREATE TABLE "machine_work_type_years" (
	"operation_id" uuid NOT NULL,
	"year" integer NOT NULL,
	"machine_id" uuid NOT NULL,
	"work_type_id" uuid NOT NULL,
	"entries" integer NOT NULL,
	"hours" numeric(14, 2) NOT NULL,
	"acres" numeric(16, 3) NOT NULL,
	CONSTRAINT "machine_work_type_years_pkey" PRIMARY KEY("operation_id","year","machine_id","work_type_id")
);
--> statement-breakpoint
ALTER TABLE "machine_household_months" ADD CONSTRAINT "machine_household_months_operation_id_operations_id_fk" FOREIGN KEY ("operation_id") REFERENCES "public"."operations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "machine_household_months" ADD CONSTRAINT "machine_household_months_machine_fk" FOREIGN KEY ("operation_id","machine_id") REFERENCES "public"."machines"("operation_id","id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "machine_work_type_years" ADD CONSTRAINT "machine_work_type_years_operation_id_operations_id_fk" FOREIGN KEY ("operation_id") REFERENCES "public"."operations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "machine_work_type_years" ADD CONSTRAINT "machine_work_type_years_machine_fk" FOREIGN KEY ("operation_id","machine_id") REFERENCES "public"."machines"("operation_id","id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "machine_household_months_emptied_idx" ON "machine_household_months" USING btree ("operation_id") WHERE "machine_household_months"."entries" = 0;--> statement-breakpoint
CREATE INDEX "machine_work_type_years_emptied_idx" ON "machine_work_type_years" USING btree ("operation_id") WHERE "machine_work_type_years"."entries" = 0;--> statement-breakpoint
-- One work entry's contribution to the sums, with the household whose use a square-up counts it as
-- (null when it counts for none); sign -1 takes a contribution back.
CREATE TYPE "work_sum_change" AS (
  sign integer, operation_id uuid, work_date date, power_machine_id uuid, implement_machine_id uuid,
  work_type_id uuid, state text, household_id uuid, hours numeric, acres numeric
);--> statement-breakpoint
CREATE FUNCTION "work_sum_household"(state text, bill_to_id uuid, bill_to_kind text, field_owner_id uuid, field_owner_kind text) RETURNS uuid
LANGUAGE sql IMMUTABLE AS $$
  SELECT CASE
    WHEN bill_to_kind = 'household' THEN CASE WHEN state IN ('approved', 'squared') THEN bill_to_id END
    WHEN field_owner_kind = 'household' AND state IN ('approved', 'invoiced', 'squared') THEN field_owner_id
  END
$$;--> statement-breakpoint
-- Adds signed contributions to both tables in one pass; rows left summing no entry are removed.
-- Changes of an operation being deleted are dropped: its sums go with it.
CREATE FUNCTION "apply_work_sum_changes"(changes work_sum_change[]) RETURNS void
LANGUAGE plpgsql AS $$
BEGIN
  IF coalesce(cardinality(changes), 0) = 0 THEN RETURN; END IF;
  INSERT INTO machine_household_months AS t (operation_id, month, machine_id, household_id, entries, hours)
  SELECT c.operation_id, date_trunc('month', c.work_date)::date, m.machine_id, c.household_id, sum(c.sign), sum(c.sign * c.hours)
  FROM unnest(changes) c
  CROSS JOIN LATERAL (VALUES (c.power_machine_id), (c.implement_machine_id)) AS m(machine_id)
  WHERE m.machine_id IS NOT NULL AND c.household_id IS NOT NULL AND EXISTS (SELECT 1 FROM operations o WHERE o.id = c.operation_id)
  GROUP BY 1, 2, 3, 4
  HAVING sum(c.sign) <> 0 OR sum(c.sign * c.hours) <> 0
  ORDER BY 1, 2, 3, 4
  ON CONFLICT (operation_id, month, machine_id, household_id)
  DO UPDATE SET entries = t.entries + excluded.entries, hours = t.hours + excluded.hours;

  INSERT INTO machine_work_type_years AS t (operation_id, year, machine_id, work_type_id, entries, hours, acres)
  SELECT c.operation_id, extract(year FROM c.work_date)::int, m.machine_id, c.work_type_id, sum(c.sign), sum(c.sign * c.hours), sum(c.sign * coalesce(c.acres, 0))
  FROM unnest(changes) c
  CROSS JOIN LATERAL (VALUES (c.power_machine_id), (c.implement_machine_id)) AS m(machine_id)
  WHERE m.machine_id IS NOT NULL AND c.state IN ('approved', 'invoiced', 'squared') AND EXISTS (SELECT 1 FROM operations o WHERE o.id = c.operation_id)
  GROUP BY 1, 2, 3, 4
  HAVING sum(c.sign) <> 0 OR sum(c.sign * c.hours) <> 0 OR sum(c.sign * coalesce(c.acres, 0)) <> 0
  ORDER BY 1, 2, 3, 4
  ON CONFLICT (operation_id, year, machine_id, work_type_id)
  DO UPDATE SET entries = t.entries + excluded.entries, hours = t.hours + excluded.hours, acres = t.acres + excluded.acres;

  DELETE FROM machine_household_months WHERE entries = 0;
  DELETE FROM machine_work_type_years WHERE entries = 0;
END
$$;--> statement-breakpoint
-- Contributions of entry rows as the parties and fields stand now.
CREATE FUNCTION "work_sum_changes_of"(sign integer, rows work_entries[]) RETURNS work_sum_change[]
LANGUAGE sql STABLE AS $$
  SELECT coalesce(array_agg(ROW(sign, e.operation_id, e.work_date, e.power_machine_id, e.implement_machine_id, e.work_type_id, e.state,
           work_sum_household(e.state, bp.id, bp.kind, fo.id, fo.kind), e.hours, e.acres)::work_sum_change), '{}')
  FROM unnest(rows) e
  LEFT JOIN parties bp ON bp.operation_id = e.operation_id AND bp.id = e.bill_to_party_id
  LEFT JOIN fields f ON f.operation_id = e.operation_id AND f.id = e.field_id
  LEFT JOIN parties fo ON fo.operation_id = e.operation_id AND fo.id = f.owner_party_id
$$;--> statement-breakpoint
CREATE FUNCTION "work_entries_sums_insert"() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  PERFORM apply_work_sum_changes(work_sum_changes_of(1, ARRAY(SELECT n::work_entries FROM new_rows n)));
  RETURN NULL;
END
$$;--> statement-breakpoint
CREATE FUNCTION "work_entries_sums_delete"() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  PERFORM apply_work_sum_changes(work_sum_changes_of(-1, ARRAY(SELECT o::work_entries FROM old_rows o)));
  RETURN NULL;
END
$$;--> statement-breakpoint
-- Only rows whose summed columns changed are taken back and added again: a note or a photo costs nothing.
CREATE FUNCTION "work_entries_sums_update"() RETURNS trigger LANGUAGE plpgsql AS $$
DECLARE
  before_rows work_entries[];
  after_rows work_entries[];
BEGIN
  SELECT coalesce(array_agg(o::work_entries), '{}'), coalesce(array_agg(n::work_entries), '{}') INTO before_rows, after_rows
  FROM old_rows o JOIN new_rows n ON n.id = o.id
  WHERE (o.operation_id, o.work_date, o.power_machine_id, o.implement_machine_id, o.work_type_id, o.state, o.bill_to_party_id, o.field_id, o.hours, o.acres)
    IS DISTINCT FROM (n.operation_id, n.work_date, n.power_machine_id, n.implement_machine_id, n.work_type_id, n.state, n.bill_to_party_id, n.field_id, n.hours, n.acres);
  PERFORM apply_work_sum_changes(work_sum_changes_of(-1, before_rows) || work_sum_changes_of(1, after_rows));
  RETURN NULL;
END
$$;--> statement-breakpoint
CREATE TRIGGER "work_entries_sums_insert" AFTER INSERT ON "work_entries" REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION work_entries_sums_insert();--> statement-breakpoint
CREATE TRIGGER "work_entries_sums_update" AFTER UPDATE ON "work_entries" REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION work_entries_sums_update();--> statement-breakpoint
CREATE TRIGGER "work_entries_sums_delete" AFTER DELETE ON "work_entries" REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION work_entries_sums_delete();--> statement-breakpoint
-- A field's owner decides whose use its customer work is: a new owner moves that work's hours.
CREATE FUNCTION "fields_work_sums_update"() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  PERFORM apply_work_sum_changes(ARRAY(
    SELECT ROW(s.sign, e.operation_id, e.work_date, e.power_machine_id, e.implement_machine_id, e.work_type_id, e.state,
               work_sum_household(e.state, bp.id, bp.kind, fo.id, fo.kind), e.hours, e.acres)::work_sum_change
    FROM old_rows o
    JOIN new_rows n ON n.id = o.id AND n.owner_party_id IS DISTINCT FROM o.owner_party_id
    JOIN work_entries e ON e.operation_id = n.operation_id AND e.field_id = n.id
    JOIN parties bp ON bp.operation_id = e.operation_id AND bp.id = e.bill_to_party_id AND bp.kind <> 'household'
    CROSS JOIN LATERAL (VALUES (-1, o.owner_party_id), (1, n.owner_party_id)) AS s(sign, owner_id)
    LEFT JOIN parties fo ON fo.operation_id = e.operation_id AND fo.id = s.owner_id));
  RETURN NULL;
END
$$;--> statement-breakpoint
CREATE TRIGGER "fields_work_sums_update" AFTER UPDATE ON "fields" REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION fields_work_sums_update();--> statement-breakpoint
-- A party turning household or customer changes whose use its work, and work on its fields, is.
CREATE FUNCTION "parties_work_sums_update"() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  PERFORM apply_work_sum_changes(ARRAY(
    WITH changed AS (
      SELECT o.id, o.kind AS old_kind FROM old_rows o JOIN new_rows n ON n.id = o.id WHERE n.kind IS DISTINCT FROM o.kind
    )
    SELECT ROW(s.sign, e.operation_id, e.work_date, e.power_machine_id, e.implement_machine_id, e.work_type_id, e.state,
               work_sum_household(e.state, bp.id, CASE WHEN s.sign < 0 THEN coalesce(cb.old_kind, bp.kind) ELSE bp.kind END,
                                  fo.id, CASE WHEN s.sign < 0 THEN coalesce(cf.old_kind, fo.kind) ELSE fo.kind END), e.hours, e.acres)::work_sum_change
    FROM work_entries e
    JOIN parties bp ON bp.operation_id = e.operation_id AND bp.id = e.bill_to_party_id
    JOIN fields f ON f.operation_id = e.operation_id AND f.id = e.field_id
    LEFT JOIN parties fo ON fo.operation_id = e.operation_id AND fo.id = f.owner_party_id
    LEFT JOIN changed cb ON cb.id = bp.id
    LEFT JOIN changed cf ON cf.id = fo.id
    CROSS JOIN (VALUES (-1), (1)) AS s(sign)
    WHERE e.operation_id IN (SELECT n.operation_id FROM new_rows n JOIN changed c ON c.id = n.id)
      AND (cb.id IS NOT NULL OR cf.id IS NOT NULL)));
  RETURN NULL;
END
$$;--> statement-breakpoint
CREATE TRIGGER "parties_work_sums_update" AFTER UPDATE ON "parties" REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION parties_work_sums_update();--> statement-breakpoint
INSERT INTO machine_household_months (operation_id, month, machine_id, household_id, entries, hours)
SELECT e.operation_id, date_trunc('month', e.work_date)::date, m.machine_id, h.household_id, count(*), sum(e.hours)
FROM work_entries e
JOIN parties bp ON bp.operation_id = e.operation_id AND bp.id = e.bill_to_party_id
JOIN fields f ON f.operation_id = e.operation_id AND f.id = e.field_id
LEFT JOIN parties fo ON fo.operation_id = e.operation_id AND fo.id = f.owner_party_id
CROSS JOIN LATERAL (SELECT work_sum_household(e.state, bp.id, bp.kind, fo.id, fo.kind) AS household_id) h
CROSS JOIN LATERAL (VALUES (e.power_machine_id), (e.implement_machine_id)) AS m(machine_id)
WHERE m.machine_id IS NOT NULL AND h.household_id IS NOT NULL
GROUP BY 1, 2, 3, 4;--> statement-breakpoint
INSERT INTO machine_work_type_years (operation_id, year, machine_id, work_type_id, entries, hours, acres)
SELECT e.operation_id, extract(year FROM e.work_date)::int, m.machine_id, e.work_type_id, count(*), sum(e.hours), sum(coalesce(e.acres, 0))
FROM work_entries e
CROSS JOIN LATERAL (VALUES (e.power_machine_id), (e.implement_machine_id)) AS m(machine_id)
WHERE m.machine_id IS NOT NULL AND e.state IN ('approved', 'invoiced', 'squared')
GROUP BY 1, 2, 3, 4;
