CREATE TABLE "operation_data_changes" (
	"txid" bigint NOT NULL,
	"operation_id" uuid NOT NULL,
	CONSTRAINT "operation_data_changes_pkey" PRIMARY KEY("txid","operation_id")
);
--> statement-breakpoint
CREATE TABLE "operation_data_versions" (
	"operation_id" uuid PRIMARY KEY NOT NULL,
	"version" bigint NOT NULL
);
--> statement-breakpoint
-- A statement's trigger notes each operation it wrote, once per transaction.
CREATE FUNCTION "note_data_change"() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  IF TG_OP = 'DELETE' THEN
    INSERT INTO operation_data_changes (txid, operation_id) SELECT DISTINCT txid_current(), operation_id FROM old_rows ON CONFLICT DO NOTHING;
  ELSE
    INSERT INTO operation_data_changes (txid, operation_id) SELECT DISTINCT txid_current(), operation_id FROM new_rows ON CONFLICT DO NOTHING;
  END IF;
  RETURN NULL;
END
$$;
--> statement-breakpoint
-- Emptying a table names no rows, so every operation counts as written.
CREATE FUNCTION "note_every_operation_changed"() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  INSERT INTO operation_data_changes (txid, operation_id) SELECT txid_current(), id FROM operations ON CONFLICT DO NOTHING;
  RETURN NULL;
END
$$;
--> statement-breakpoint
CREATE FUNCTION "publish_data_change"() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  INSERT INTO operation_data_versions AS v (operation_id, version) VALUES (NEW.operation_id, 1)
  ON CONFLICT (operation_id) DO UPDATE SET version = v.version + 1;
  DELETE FROM operation_data_changes WHERE txid = NEW.txid AND operation_id = NEW.operation_id;
  RETURN NULL;
END
$$;
--> statement-breakpoint
CREATE CONSTRAINT TRIGGER "operation_data_changes_publish" AFTER INSERT ON "operation_data_changes"
  DEFERRABLE INITIALLY DEFERRED FOR EACH ROW EXECUTE FUNCTION publish_data_change();
--> statement-breakpoint
-- Every table of an operation's rows except the audit log and idempotency keys (never part of an answer) and
-- the machine sums (written only inside a work_entries statement, which notes the change itself).
DO $$
DECLARE
  t text;
BEGIN
  FOREACH t IN ARRAY ARRAY['checkout_sessions', 'cost_entries', 'fields', 'invoice_counters', 'invoice_entries',
    'invoice_lines', 'invoices', 'machine_rates', 'machine_shares', 'machines', 'memberships', 'meter_readings',
    'parties', 'payment_refunds', 'payments', 'rate_sheet_lines', 'rate_sheets', 'square_up_transfers', 'square_ups',
    'uploads', 'work_entries', 'work_entry_photos', 'work_types'] LOOP
    EXECUTE format('CREATE TRIGGER %I AFTER INSERT ON %I REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION note_data_change()', t || '_data_change_insert', t);
    EXECUTE format('CREATE TRIGGER %I AFTER UPDATE ON %I REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION note_data_change()', t || '_data_change_update', t);
    EXECUTE format('CREATE TRIGGER %I AFTER DELETE ON %I REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION note_data_change()', t || '_data_change_delete', t);
    EXECUTE format('CREATE TRIGGER %I AFTER TRUNCATE ON %I FOR EACH STATEMENT EXECUTE FUNCTION note_every_operation_changed()', t || '_data_change_truncate', t);
  END LOOP;
END
$$;
--> statement-breakpoint
-- An operation's own details and its members' names and e-mail addresses appear in answers too.
CREATE FUNCTION "note_operation_change"() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  INSERT INTO operation_data_changes (txid, operation_id) VALUES (txid_current(), NEW.id) ON CONFLICT DO NOTHING;
  RETURN NULL;
END
$$;
--> statement-breakpoint
CREATE TRIGGER "operations_data_change" AFTER UPDATE ON "operations" FOR EACH ROW EXECUTE FUNCTION note_operation_change();
--> statement-breakpoint
CREATE FUNCTION "note_member_change"() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  INSERT INTO operation_data_changes (txid, operation_id)
  SELECT DISTINCT txid_current(), m.operation_id FROM memberships m WHERE m.user_id = NEW.id ON CONFLICT DO NOTHING;
  RETURN NULL;
END
$$;
--> statement-breakpoint
CREATE TRIGGER "users_data_change" AFTER UPDATE OF "name", "email" ON "users" FOR EACH ROW
  WHEN (OLD.name IS DISTINCT FROM NEW.name OR OLD.email IS DISTINCT FROM NEW.email) EXECUTE FUNCTION note_member_change();
