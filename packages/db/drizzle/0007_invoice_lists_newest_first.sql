DROP INDEX "invoices_operation_created_idx";--> statement-breakpoint
DROP INDEX "invoices_operation_party_created_idx";--> statement-breakpoint
CREATE INDEX "invoices_operation_created_idx" ON "invoices" USING btree ("operation_id","created_at" DESC NULLS FIRST,"id");--> statement-breakpoint
CREATE INDEX "invoices_operation_party_created_idx" ON "invoices" USING btree ("operation_id","party_id","created_at" DESC NULLS FIRST,"id");