-- Billing moves customer work between approved and invoiced, which counts alike in both sums; such rows are
-- left out before any sum is touched, so issuing or voiding a long invoice does not take back and add again
-- every entry on it. Work billed to a household counts only while approved or squared, so it is kept in.
CREATE OR REPLACE FUNCTION "work_entries_sums_update"() RETURNS trigger LANGUAGE plpgsql AS $$
DECLARE
  before_rows work_entries[];
  after_rows work_entries[];
BEGIN
  SELECT coalesce(array_agg(o::work_entries), '{}'), coalesce(array_agg(n::work_entries), '{}') INTO before_rows, after_rows
  FROM old_rows o JOIN new_rows n ON n.id = o.id
  WHERE (o.operation_id, o.work_date, o.power_machine_id, o.implement_machine_id, o.work_type_id, o.bill_to_party_id, o.field_id, o.hours, o.acres)
      IS DISTINCT FROM (n.operation_id, n.work_date, n.power_machine_id, n.implement_machine_id, n.work_type_id, n.bill_to_party_id, n.field_id, n.hours, n.acres)
    OR (o.state IS DISTINCT FROM n.state
      AND NOT (o.state IN ('approved', 'invoiced') AND n.state IN ('approved', 'invoiced')
        AND NOT EXISTS (SELECT 1 FROM parties bp WHERE bp.operation_id = n.operation_id AND bp.id = n.bill_to_party_id AND bp.kind = 'household')));
  PERFORM apply_work_sum_changes(work_sum_changes_of(-1, before_rows) || work_sum_changes_of(1, after_rows));
  RETURN NULL;
END
$$;
