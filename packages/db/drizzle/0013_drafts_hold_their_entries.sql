-- Drafts now hold their entries from the moment they are made, so issuing writes nothing per entry. Drafts
-- made before take hold of what they still can: each entry still approved for the draft's party, at the
-- version the draft priced, and held by no invoice; an entry on two drafts goes to the older one. A draft
-- left without some of its entries is refused at issue, naming them, and is made again.
WITH taken AS (
  SELECT DISTINCT ON (l.work_entry_id) l.work_entry_id, i.operation_id, i.id AS invoice_id
  FROM invoice_lines l
  JOIN invoices i ON i.operation_id = l.operation_id AND i.id = l.invoice_id AND i.status = 'draft'
  JOIN work_entries we ON we.operation_id = l.operation_id AND we.id = l.work_entry_id
  WHERE l.kind = 'work' AND l.work_entry_id IS NOT NULL
    AND we.state = 'approved'
    AND we.bill_to_party_id = i.party_id
    AND we.version = coalesce((l.details ->> 'entryVersion')::int, we.version)
    AND NOT EXISTS (SELECT 1 FROM invoice_entries ie WHERE ie.work_entry_id = l.work_entry_id)
  ORDER BY l.work_entry_id, i.created_at, i.id
),
held AS (
  INSERT INTO invoice_entries (work_entry_id, operation_id, invoice_id)
  SELECT work_entry_id, operation_id, invoice_id FROM taken
  RETURNING work_entry_id, operation_id
)
UPDATE work_entries we
SET state = 'invoiced', version = we.version + 1, updated_at = now()
FROM held
WHERE we.operation_id = held.operation_id AND we.id = held.work_entry_id;
