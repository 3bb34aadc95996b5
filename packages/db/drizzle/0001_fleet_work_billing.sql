CREATE TABLE "uploads" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"operation_id" uuid NOT NULL,
	"purpose" text NOT NULL,
	"original_name" text NOT NULL,
	"content_type" text NOT NULL,
	"size_bytes" bigint NOT NULL,
	"storage_key" text NOT NULL,
	"sha256" text NOT NULL,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "uploads_storage_key_key" UNIQUE("storage_key"),
	CONSTRAINT "uploads_operation_id_id_key" UNIQUE("operation_id","id")
);
--> statement-breakpoint
CREATE TABLE "cost_entries" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"operation_id" uuid NOT NULL,
	"machine_id" uuid NOT NULL,
	"category" text NOT NULL,
	"incurred_on" date NOT NULL,
	"amount" numeric(14, 2) NOT NULL,
	"gallons" numeric(12, 3),
	"meter_hours" numeric(12, 1),
	"vendor" text,
	"paid_by_party_id" uuid,
	"improvement_life_years" integer,
	"receipt_upload_id" uuid,
	"notes" text,
	"import_key" text,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "cost_entries_operation_import_key" UNIQUE("operation_id","import_key"),
	CONSTRAINT "cost_entries_amount_check" CHECK ("cost_entries"."amount" >= 0),
	CONSTRAINT "cost_entries_category_check" CHECK ("cost_entries"."category" in ('fuel', 'repair', 'parts', 'tires', 'insurance', 'taxes', 'housing', 'interest', 'improvement')),
	CONSTRAINT "cost_entries_improvement_life_check" CHECK ("cost_entries"."category" <> 'improvement' or coalesce("cost_entries"."improvement_life_years", 0) >= 1)
);
--> statement-breakpoint
CREATE TABLE "machine_shares" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"operation_id" uuid NOT NULL,
	"machine_id" uuid NOT NULL,
	"party_id" uuid NOT NULL,
	"share_pct" numeric(7, 4) NOT NULL,
	"effective_from" date NOT NULL,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "machine_shares_machine_date_party_key" UNIQUE("machine_id","effective_from","party_id"),
	CONSTRAINT "machine_shares_pct_check" CHECK ("machine_shares"."share_pct" > 0 and "machine_shares"."share_pct" <= 100)
);
--> statement-breakpoint
CREATE TABLE "machines" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"operation_id" uuid NOT NULL,
	"name" text NOT NULL,
	"class_id" text NOT NULL,
	"kind" text NOT NULL,
	"make" text,
	"model" text,
	"year" integer,
	"serial_number" text,
	"unit_number" text,
	"pto_hp" numeric(8, 1),
	"fuel_type" text,
	"width_ft" numeric(8, 2),
	"list_price" numeric(14, 2),
	"purchase_price" numeric(14, 2),
	"purchase_date" date,
	"hours_at_purchase" numeric(12, 1) DEFAULT '0' NOT NULL,
	"planned_years_owned" integer,
	"planned_hours_per_year" numeric(10, 1),
	"speed_mph" numeric(6, 2),
	"field_efficiency_pct" numeric(5, 2),
	"repair_factor1" numeric(8, 4),
	"repair_factor2" numeric(8, 4),
	"status" text DEFAULT 'active' NOT NULL,
	"photo_upload_id" uuid,
	"notes" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "machines_operation_id_id_key" UNIQUE("operation_id","id"),
	CONSTRAINT "machines_kind_check" CHECK ("machines"."kind" in ('power', 'self-propelled', 'implement')),
	CONSTRAINT "machines_status_check" CHECK ("machines"."status" in ('active', 'sold', 'retired')),
	CONSTRAINT "machines_fuel_check" CHECK ("machines"."fuel_type" is null or "machines"."fuel_type" in ('diesel', 'gasoline', 'lpg')),
	CONSTRAINT "machines_prices_check" CHECK (coalesce("machines"."list_price", 0) >= 0 and coalesce("machines"."purchase_price", 0) >= 0)
);
--> statement-breakpoint
CREATE TABLE "meter_readings" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"operation_id" uuid NOT NULL,
	"machine_id" uuid NOT NULL,
	"read_at" timestamp with time zone NOT NULL,
	"hours" numeric(12, 1) NOT NULL,
	"kind" text DEFAULT 'reading' NOT NULL,
	"offset_hours" numeric(12, 1) DEFAULT '0' NOT NULL,
	"source" text DEFAULT 'manual' NOT NULL,
	"work_entry_id" uuid,
	"note" text,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "meter_readings_hours_check" CHECK ("meter_readings"."hours" >= 0 and "meter_readings"."offset_hours" >= 0),
	CONSTRAINT "meter_readings_kind_check" CHECK ("meter_readings"."kind" in ('reading', 'reset'))
);
--> statement-breakpoint
CREATE TABLE "fields" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"operation_id" uuid NOT NULL,
	"kind" text DEFAULT 'field' NOT NULL,
	"name" text NOT NULL,
	"acres" numeric(12, 3) NOT NULL,
	"owner_party_id" uuid,
	"farm_label" text,
	"notes" text,
	"boundary" jsonb,
	"boundary_acres" numeric(12, 3),
	"road_name" text,
	"road_from" text,
	"road_to" text,
	"length_miles" numeric(10, 3),
	"width_ft" numeric(8, 2),
	"archived_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "fields_operation_id_id_key" UNIQUE("operation_id","id"),
	CONSTRAINT "fields_kind_check" CHECK ("fields"."kind" in ('field', 'roadside')),
	CONSTRAINT "fields_acres_check" CHECK ("fields"."acres" >= 0),
	CONSTRAINT "fields_roadside_check" CHECK ("fields"."kind" <> 'roadside' or ("fields"."length_miles" > 0 and "fields"."width_ft" > 0))
);
--> statement-breakpoint
CREATE TABLE "work_entries" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"operation_id" uuid NOT NULL,
	"work_date" date NOT NULL,
	"operator_user_id" uuid NOT NULL,
	"field_id" uuid NOT NULL,
	"power_machine_id" uuid,
	"implement_machine_id" uuid,
	"work_type_id" uuid NOT NULL,
	"meter_start" numeric(12, 1),
	"meter_end" numeric(12, 1),
	"started_at" timestamp with time zone,
	"ended_at" timestamp with time zone,
	"hours" numeric(8, 2) NOT NULL,
	"operator_hours" numeric(8, 2),
	"acres" numeric(12, 3),
	"miles" numeric(10, 3),
	"loads" numeric(10, 2),
	"each_count" numeric(10, 2),
	"fuel_gallons" numeric(10, 3),
	"bill_to_party_id" uuid NOT NULL,
	"notes" text,
	"state" text DEFAULT 'draft' NOT NULL,
	"submitted_at" timestamp with time zone,
	"approved_at" timestamp with time zone,
	"approved_by" uuid,
	"client_id" uuid,
	"import_key" text,
	"version" integer DEFAULT 1 NOT NULL,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "work_entries_operation_id_id_key" UNIQUE("operation_id","id"),
	CONSTRAINT "work_entries_operation_client_id_key" UNIQUE("operation_id","client_id"),
	CONSTRAINT "work_entries_operation_import_key" UNIQUE("operation_id","import_key"),
	CONSTRAINT "work_entries_state_check" CHECK ("work_entries"."state" in ('draft', 'submitted', 'approved', 'invoiced', 'squared')),
	CONSTRAINT "work_entries_hours_check" CHECK ("work_entries"."hours" >= 0 and "work_entries"."hours" <= 24),
	CONSTRAINT "work_entries_meter_order_check" CHECK ("work_entries"."meter_start" is null or "work_entries"."meter_end" is null or "work_entries"."meter_end" >= "work_entries"."meter_start"),
	CONSTRAINT "work_entries_clock_order_check" CHECK ("work_entries"."started_at" is null or "work_entries"."ended_at" is null or "work_entries"."ended_at" >= "work_entries"."started_at"),
	CONSTRAINT "work_entries_quantities_check" CHECK (coalesce("work_entries"."acres", 0) >= 0 and coalesce("work_entries"."miles", 0) >= 0 and coalesce("work_entries"."loads", 0) >= 0 and coalesce("work_entries"."each_count", 0) >= 0 and coalesce("work_entries"."fuel_gallons", 0) >= 0)
);
--> statement-breakpoint
CREATE TABLE "work_entry_photos" (
	"operation_id" uuid NOT NULL,
	"work_entry_id" uuid NOT NULL,
	"upload_id" uuid NOT NULL,
	CONSTRAINT "work_entry_photos_pkey" PRIMARY KEY("work_entry_id","upload_id")
);
--> statement-breakpoint
CREATE TABLE "work_types" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"operation_id" uuid NOT NULL,
	"key" text NOT NULL,
	"name" text NOT NULL,
	"default_unit" text NOT NULL,
	"cautions" text[] DEFAULT '{}'::text[] NOT NULL,
	"typical_class_id" text,
	"archived" boolean DEFAULT false NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "work_types_operation_id_id_key" UNIQUE("operation_id","id"),
	CONSTRAINT "work_types_operation_key_key" UNIQUE("operation_id","key"),
	CONSTRAINT "work_types_unit_check" CHECK ("work_types"."default_unit" in ('acre', 'hour', 'mile', 'load', 'each'))
);
--> statement-breakpoint
CREATE TABLE "machine_rates" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"operation_id" uuid NOT NULL,
	"rate_sheet_id" uuid NOT NULL,
	"machine_id" uuid NOT NULL,
	"rate_per_hour" numeric(14, 4) NOT NULL,
	CONSTRAINT "machine_rates_sheet_machine_key" UNIQUE("rate_sheet_id","machine_id"),
	CONSTRAINT "machine_rates_rate_check" CHECK ("machine_rates"."rate_per_hour" >= 0)
);
--> statement-breakpoint
CREATE TABLE "rate_sheet_lines" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"operation_id" uuid NOT NULL,
	"rate_sheet_id" uuid NOT NULL,
	"work_type_id" uuid NOT NULL,
	"unit" text NOT NULL,
	"rate" numeric(14, 4) NOT NULL,
	"charge_type" text DEFAULT 'custom' NOT NULL,
	"minimum_charge" numeric(14, 2),
	CONSTRAINT "rate_sheet_lines_sheet_type_unit_key" UNIQUE("rate_sheet_id","work_type_id","unit","charge_type"),
	CONSTRAINT "rate_sheet_lines_rate_check" CHECK ("rate_sheet_lines"."rate" >= 0)
);
--> statement-breakpoint
CREATE TABLE "rate_sheets" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"operation_id" uuid NOT NULL,
	"name" text NOT NULL,
	"relationship" text NOT NULL,
	"party_id" uuid,
	"effective_from" date NOT NULL,
	"minimum_charge" numeric(14, 2) DEFAULT '0' NOT NULL,
	"minimum_per" text DEFAULT 'entry' NOT NULL,
	"travel_flat" numeric(14, 2) DEFAULT '0' NOT NULL,
	"travel_per_mile" numeric(14, 4) DEFAULT '0' NOT NULL,
	"fuel_base_price" numeric(14, 4),
	"fuel_step" numeric(14, 4),
	"fuel_adjust_pct_per_step" numeric(7, 4),
	"operator_wage" numeric(14, 2) DEFAULT '0' NOT NULL,
	"labor_factor" numeric(6, 3) DEFAULT '1.1' NOT NULL,
	"terms_days" integer DEFAULT 30 NOT NULL,
	"notes" text,
	"archived_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "rate_sheets_operation_id_id_key" UNIQUE("operation_id","id"),
	CONSTRAINT "rate_sheets_relationship_check" CHECK ("rate_sheets"."relationship" in ('family', 'neighbour', 'agency')),
	CONSTRAINT "rate_sheets_money_check" CHECK ("rate_sheets"."minimum_charge" >= 0 and "rate_sheets"."travel_flat" >= 0 and "rate_sheets"."travel_per_mile" >= 0 and "rate_sheets"."operator_wage" >= 0)
);
--> statement-breakpoint
CREATE TABLE "checkout_sessions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"operation_id" uuid NOT NULL,
	"invoice_id" uuid NOT NULL,
	"stripe_session_id" text NOT NULL,
	"amount_cents" bigint NOT NULL,
	"currency" text DEFAULT 'usd' NOT NULL,
	"status" text DEFAULT 'open' NOT NULL,
	"url" text NOT NULL,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"expires_at" timestamp with time zone,
	CONSTRAINT "checkout_sessions_stripe_session_key" UNIQUE("stripe_session_id")
);
--> statement-breakpoint
CREATE TABLE "invoice_counters" (
	"operation_id" uuid NOT NULL,
	"series" text NOT NULL,
	"next_number" integer DEFAULT 1 NOT NULL,
	CONSTRAINT "invoice_counters_pkey" PRIMARY KEY("operation_id","series")
);
--> statement-breakpoint
CREATE TABLE "invoice_entries" (
	"work_entry_id" uuid NOT NULL,
	"operation_id" uuid NOT NULL,
	"invoice_id" uuid NOT NULL,
	CONSTRAINT "invoice_entries_pkey" PRIMARY KEY("work_entry_id")
);
--> statement-breakpoint
CREATE TABLE "invoice_lines" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"operation_id" uuid NOT NULL,
	"invoice_id" uuid NOT NULL,
	"position" integer NOT NULL,
	"kind" text NOT NULL,
	"work_entry_id" uuid,
	"work_date" date,
	"description" text NOT NULL,
	"field_name" text,
	"work_type_name" text,
	"quantity" numeric(12, 3),
	"unit" text,
	"rate" numeric(14, 4),
	"amount" numeric(14, 2) NOT NULL,
	"details" jsonb,
	CONSTRAINT "invoice_lines_invoice_position_key" UNIQUE("invoice_id","position")
);
--> statement-breakpoint
CREATE TABLE "invoices" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"operation_id" uuid NOT NULL,
	"kind" text DEFAULT 'invoice' NOT NULL,
	"series" text DEFAULT 'INV' NOT NULL,
	"number" integer,
	"party_id" uuid NOT NULL,
	"status" text DEFAULT 'draft' NOT NULL,
	"period_from" date,
	"period_to" date,
	"issue_date" date,
	"due_date" date,
	"terms_days" integer DEFAULT 30 NOT NULL,
	"subtotal" numeric(14, 2) DEFAULT '0' NOT NULL,
	"total" numeric(14, 2) DEFAULT '0' NOT NULL,
	"amount_paid" numeric(14, 2) DEFAULT '0' NOT NULL,
	"notes" text,
	"credit_of_invoice_id" uuid,
	"issuer_snapshot" jsonb,
	"party_snapshot" jsonb,
	"issued_at" timestamp with time zone,
	"issued_by" uuid,
	"voided_at" timestamp with time zone,
	"void_reason" text,
	"sent_at" timestamp with time zone,
	"version" integer DEFAULT 1 NOT NULL,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "invoices_operation_id_id_key" UNIQUE("operation_id","id"),
	CONSTRAINT "invoices_operation_series_number_key" UNIQUE("operation_id","series","number"),
	CONSTRAINT "invoices_kind_check" CHECK ("invoices"."kind" in ('invoice', 'credit-note')),
	CONSTRAINT "invoices_status_check" CHECK ("invoices"."status" in ('draft', 'issued', 'void')),
	CONSTRAINT "invoices_number_when_issued_check" CHECK (("invoices"."status" = 'draft') = ("invoices"."number" is null)),
	CONSTRAINT "invoices_credit_note_check" CHECK (("invoices"."kind" = 'credit-note') = ("invoices"."credit_of_invoice_id" is not null))
);
--> statement-breakpoint
CREATE TABLE "payments" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"operation_id" uuid NOT NULL,
	"invoice_id" uuid NOT NULL,
	"method" text NOT NULL,
	"amount" numeric(14, 2) NOT NULL,
	"received_on" date NOT NULL,
	"reference" text,
	"stripe_payment_intent_id" text,
	"stripe_checkout_session_id" text,
	"status" text DEFAULT 'succeeded' NOT NULL,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "payments_stripe_payment_intent_key" UNIQUE("stripe_payment_intent_id"),
	CONSTRAINT "payments_amount_check" CHECK ("payments"."amount" > 0),
	CONSTRAINT "payments_method_check" CHECK ("payments"."method" in ('card', 'cheque', 'cash', 'transfer'))
);
--> statement-breakpoint
CREATE TABLE "stripe_events" (
	"id" text PRIMARY KEY NOT NULL,
	"type" text NOT NULL,
	"stripe_created_at" timestamp with time zone,
	"received_at" timestamp with time zone DEFAULT now() NOT NULL,
	"outcome" text
);
--> statement-breakpoint
CREATE TABLE "idempotency_keys" (
	"operation_id" uuid NOT NULL,
	"key" text NOT NULL,
	"route" text NOT NULL,
	"request_hash" text NOT NULL,
	"status_code" integer,
	"response" jsonb,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "idempotency_keys_operation_key_key" UNIQUE("operation_id","key")
);
--> statement-breakpoint
CREATE TABLE "square_up_transfers" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"operation_id" uuid NOT NULL,
	"square_up_id" uuid NOT NULL,
	"from_party_id" uuid NOT NULL,
	"to_party_id" uuid NOT NULL,
	"amount" numeric(14, 2) NOT NULL,
	"paid_on" date,
	"method" text,
	"reference" text,
	"recorded_by" uuid,
	"recorded_at" timestamp with time zone,
	CONSTRAINT "square_up_transfers_amount_check" CHECK ("square_up_transfers"."amount" > 0),
	CONSTRAINT "square_up_transfers_parties_check" CHECK ("square_up_transfers"."from_party_id" <> "square_up_transfers"."to_party_id")
);
--> statement-breakpoint
CREATE TABLE "square_ups" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"operation_id" uuid NOT NULL,
	"name" text NOT NULL,
	"period_from" date NOT NULL,
	"period_to" date NOT NULL,
	"status" text DEFAULT 'open' NOT NULL,
	"closed_at" timestamp with time zone,
	"closed_by" uuid,
	"statement" jsonb,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "square_ups_operation_id_id_key" UNIQUE("operation_id","id"),
	CONSTRAINT "square_ups_period_check" CHECK ("square_ups"."period_to" >= "square_ups"."period_from"),
	CONSTRAINT "square_ups_status_check" CHECK ("square_ups"."status" in ('open', 'closed'))
);
--> statement-breakpoint
ALTER TABLE "uploads" ADD CONSTRAINT "uploads_operation_id_operations_id_fk" FOREIGN KEY ("operation_id") REFERENCES "public"."operations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "uploads" ADD CONSTRAINT "uploads_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cost_entries" ADD CONSTRAINT "cost_entries_operation_id_operations_id_fk" FOREIGN KEY ("operation_id") REFERENCES "public"."operations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cost_entries" ADD CONSTRAINT "cost_entries_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cost_entries" ADD CONSTRAINT "cost_entries_machine_fk" FOREIGN KEY ("operation_id","machine_id") REFERENCES "public"."machines"("operation_id","id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cost_entries" ADD CONSTRAINT "cost_entries_paid_by_fk" FOREIGN KEY ("operation_id","paid_by_party_id") REFERENCES "public"."parties"("operation_id","id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cost_entries" ADD CONSTRAINT "cost_entries_receipt_fk" FOREIGN KEY ("operation_id","receipt_upload_id") REFERENCES "public"."uploads"("operation_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "machine_shares" ADD CONSTRAINT "machine_shares_operation_id_operations_id_fk" FOREIGN KEY ("operation_id") REFERENCES "public"."operations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "machine_shares" ADD CONSTRAINT "machine_shares_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "machine_shares" ADD CONSTRAINT "machine_shares_machine_fk" FOREIGN KEY ("operation_id","machine_id") REFERENCES "public"."machines"("operation_id","id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "machine_shares" ADD CONSTRAINT "machine_shares_party_fk" FOREIGN KEY ("operation_id","party_id") REFERENCES "public"."parties"("operation_id","id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "machines" ADD CONSTRAINT "machines_operation_id_operations_id_fk" FOREIGN KEY ("operation_id") REFERENCES "public"."operations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "machines" ADD CONSTRAINT "machines_photo_fk" FOREIGN KEY ("operation_id","photo_upload_id") REFERENCES "public"."uploads"("operation_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "meter_readings" ADD CONSTRAINT "meter_readings_operation_id_operations_id_fk" FOREIGN KEY ("operation_id") REFERENCES "public"."operations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "meter_readings" ADD CONSTRAINT "meter_readings_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "meter_readings" ADD CONSTRAINT "meter_readings_machine_fk" FOREIGN KEY ("operation_id","machine_id") REFERENCES "public"."machines"("operation_id","id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "fields" ADD CONSTRAINT "fields_operation_id_operations_id_fk" FOREIGN KEY ("operation_id") REFERENCES "public"."operations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "fields" ADD CONSTRAINT "fields_owner_party_fk" FOREIGN KEY ("operation_id","owner_party_id") REFERENCES "public"."parties"("operation_id","id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "work_entries" ADD CONSTRAINT "work_entries_operation_id_operations_id_fk" FOREIGN KEY ("operation_id") REFERENCES "public"."operations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "work_entries" ADD CONSTRAINT "work_entries_operator_user_id_users_id_fk" FOREIGN KEY ("operator_user_id") REFERENCES "public"."users"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "work_entries" ADD CONSTRAINT "work_entries_approved_by_users_id_fk" FOREIGN KEY ("approved_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "work_entries" ADD CONSTRAINT "work_entries_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "work_entries" ADD CONSTRAINT "work_entries_field_fk" FOREIGN KEY ("operation_id","field_id") REFERENCES "public"."fields"("operation_id","id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "work_entries" ADD CONSTRAINT "work_entries_power_fk" FOREIGN KEY ("operation_id","power_machine_id") REFERENCES "public"."machines"("operation_id","id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "work_entries" ADD CONSTRAINT "work_entries_implement_fk" FOREIGN KEY ("operation_id","implement_machine_id") REFERENCES "public"."machines"("operation_id","id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "work_entries" ADD CONSTRAINT "work_entries_work_type_fk" FOREIGN KEY ("operation_id","work_type_id") REFERENCES "public"."work_types"("operation_id","id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "work_entries" ADD CONSTRAINT "work_entries_bill_to_fk" FOREIGN KEY ("operation_id","bill_to_party_id") REFERENCES "public"."parties"("operation_id","id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "work_entry_photos" ADD CONSTRAINT "work_entry_photos_entry_fk" FOREIGN KEY ("operation_id","work_entry_id") REFERENCES "public"."work_entries"("operation_id","id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "work_entry_photos" ADD CONSTRAINT "work_entry_photos_upload_fk" FOREIGN KEY ("operation_id","upload_id") REFERENCES "public"."uploads"("operation_id","id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "work_types" ADD CONSTRAINT "work_types_operation_id_operations_id_fk" FOREIGN KEY ("operation_id") REFERENCES "public"."operations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "machine_rates" ADD CONSTRAINT "machine_rates_sheet_fk" FOREIGN KEY ("operation_id","rate_sheet_id") REFERENCES "public"."rate_sheets"("operation_id","id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "machine_rates" ADD CONSTRAINT "machine_rates_machine_fk" FOREIGN KEY ("operation_id","machine_id") REFERENCES "public"."machines"("operation_id","id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "rate_sheet_lines" ADD CONSTRAINT "rate_sheet_lines_sheet_fk" FOREIGN KEY ("operation_id","rate_sheet_id") REFERENCES "public"."rate_sheets"("operation_id","id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "rate_sheet_lines" ADD CONSTRAINT "rate_sheet_lines_work_type_fk" FOREIGN KEY ("operation_id","work_type_id") REFERENCES "public"."work_types"("operation_id","id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "rate_sheets" ADD CONSTRAINT "rate_sheets_operation_id_operations_id_fk" FOREIGN KEY ("operation_id") REFERENCES "public"."operations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "rate_sheets" ADD CONSTRAINT "rate_sheets_party_fk" FOREIGN KEY ("operation_id","party_id") REFERENCES "public"."parties"("operation_id","id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "checkout_sessions" ADD CONSTRAINT "checkout_sessions_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "checkout_sessions" ADD CONSTRAINT "checkout_sessions_invoice_fk" FOREIGN KEY ("operation_id","invoice_id") REFERENCES "public"."invoices"("operation_id","id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "invoice_counters" ADD CONSTRAINT "invoice_counters_operation_id_operations_id_fk" FOREIGN KEY ("operation_id") REFERENCES "public"."operations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "invoice_entries" ADD CONSTRAINT "invoice_entries_entry_fk" FOREIGN KEY ("operation_id","work_entry_id") REFERENCES "public"."work_entries"("operation_id","id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "invoice_entries" ADD CONSTRAINT "invoice_entries_invoice_fk" FOREIGN KEY ("operation_id","invoice_id") REFERENCES "public"."invoices"("operation_id","id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "invoice_lines" ADD CONSTRAINT "invoice_lines_invoice_fk" FOREIGN KEY ("operation_id","invoice_id") REFERENCES "public"."invoices"("operation_id","id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "invoices" ADD CONSTRAINT "invoices_operation_id_operations_id_fk" FOREIGN KEY ("operation_id") REFERENCES "public"."operations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "invoices" ADD CONSTRAINT "invoices_issued_by_users_id_fk" FOREIGN KEY ("issued_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "invoices" ADD CONSTRAINT "invoices_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "invoices" ADD CONSTRAINT "invoices_party_fk" FOREIGN KEY ("operation_id","party_id") REFERENCES "public"."parties"("operation_id","id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "invoices" ADD CONSTRAINT "invoices_credit_of_fk" FOREIGN KEY ("operation_id","credit_of_invoice_id") REFERENCES "public"."invoices"("operation_id","id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "payments" ADD CONSTRAINT "payments_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "payments" ADD CONSTRAINT "payments_invoice_fk" FOREIGN KEY ("operation_id","invoice_id") REFERENCES "public"."invoices"("operation_id","id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "idempotency_keys" ADD CONSTRAINT "idempotency_keys_operation_id_operations_id_fk" FOREIGN KEY ("operation_id") REFERENCES "public"."operations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "square_up_transfers" ADD CONSTRAINT "square_up_transfers_recorded_by_users_id_fk" FOREIGN KEY ("recorded_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "square_up_transfers" ADD CONSTRAINT "square_up_transfers_square_up_fk" FOREIGN KEY ("operation_id","square_up_id") REFERENCES "public"."square_ups"("operation_id","id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "square_up_transfers" ADD CONSTRAINT "square_up_transfers_from_fk" FOREIGN KEY ("operation_id","from_party_id") REFERENCES "public"."parties"("operation_id","id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "square_up_transfers" ADD CONSTRAINT "square_up_transfers_to_fk" FOREIGN KEY ("operation_id","to_party_id") REFERENCES "public"."parties"("operation_id","id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "square_ups" ADD CONSTRAINT "square_ups_operation_id_operations_id_fk" FOREIGN KEY ("operation_id") REFERENCES "public"."operations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "square_ups" ADD CONSTRAINT "square_ups_closed_by_users_id_fk" FOREIGN KEY ("closed_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "square_ups" ADD CONSTRAINT "square_ups_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "uploads_operation_purpose_idx" ON "uploads" USING btree ("operation_id","purpose");--> statement-breakpoint
CREATE INDEX "cost_entries_operation_machine_date_idx" ON "cost_entries" USING btree ("operation_id","machine_id","incurred_on");--> statement-breakpoint
CREATE INDEX "cost_entries_operation_date_idx" ON "cost_entries" USING btree ("operation_id","incurred_on");--> statement-breakpoint
CREATE INDEX "machines_operation_status_name_idx" ON "machines" USING btree ("operation_id","status","name");--> statement-breakpoint
CREATE INDEX "meter_readings_machine_read_at_idx" ON "meter_readings" USING btree ("machine_id","read_at");--> statement-breakpoint
CREATE INDEX "fields_operation_kind_name_idx" ON "fields" USING btree ("operation_id","kind","name");--> statement-breakpoint
CREATE INDEX "work_entries_operation_date_idx" ON "work_entries" USING btree ("operation_id","work_date");--> statement-breakpoint
CREATE INDEX "work_entries_operation_state_date_idx" ON "work_entries" USING btree ("operation_id","state","work_date");--> statement-breakpoint
CREATE INDEX "work_entries_operation_bill_to_state_idx" ON "work_entries" USING btree ("operation_id","bill_to_party_id","state","work_date");--> statement-breakpoint
CREATE INDEX "work_entries_operation_field_date_idx" ON "work_entries" USING btree ("operation_id","field_id","work_date");--> statement-breakpoint
CREATE INDEX "work_entries_operation_power_date_idx" ON "work_entries" USING btree ("operation_id","power_machine_id","work_date");--> statement-breakpoint
CREATE INDEX "work_entries_operation_implement_date_idx" ON "work_entries" USING btree ("operation_id","implement_machine_id","work_date");--> statement-breakpoint
CREATE INDEX "work_entries_operation_operator_date_idx" ON "work_entries" USING btree ("operation_id","operator_user_id","work_date");--> statement-breakpoint
CREATE INDEX "work_entries_operation_work_type_date_idx" ON "work_entries" USING btree ("operation_id","work_type_id","work_date");--> statement-breakpoint
CREATE INDEX "rate_sheets_operation_relationship_from_idx" ON "rate_sheets" USING btree ("operation_id","relationship","effective_from");--> statement-breakpoint
CREATE INDEX "checkout_sessions_invoice_idx" ON "checkout_sessions" USING btree ("invoice_id");--> statement-breakpoint
CREATE INDEX "invoice_entries_invoice_idx" ON "invoice_entries" USING btree ("invoice_id");--> statement-breakpoint
CREATE INDEX "invoice_lines_work_entry_idx" ON "invoice_lines" USING btree ("work_entry_id");--> statement-breakpoint
CREATE INDEX "invoices_operation_party_status_idx" ON "invoices" USING btree ("operation_id","party_id","status");--> statement-breakpoint
CREATE INDEX "invoices_operation_status_due_idx" ON "invoices" USING btree ("operation_id","status","due_date");--> statement-breakpoint
CREATE INDEX "invoices_operation_number_idx" ON "invoices" USING btree ("operation_id","number");--> statement-breakpoint
CREATE INDEX "payments_operation_invoice_idx" ON "payments" USING btree ("operation_id","invoice_id");--> statement-breakpoint
CREATE INDEX "square_ups_operation_period_idx" ON "square_ups" USING btree ("operation_id","period_from");