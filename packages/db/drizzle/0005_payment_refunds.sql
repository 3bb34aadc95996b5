CREATE TABLE "payment_refunds" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"operation_id" uuid NOT NULL,
	"payment_id" uuid NOT NULL,
	"stripe_refund_id" text NOT NULL,
	"amount" numeric(14, 2) NOT NULL,
	"reason" text,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "payment_refunds_stripe_refund_key" UNIQUE("stripe_refund_id"),
	CONSTRAINT "payment_refunds_amount_check" CHECK ("payment_refunds"."amount" > 0)
);
--> statement-breakpoint
ALTER TABLE "payments" ADD COLUMN "amount_refunded" numeric(14, 2) DEFAULT '0' NOT NULL;--> statement-breakpoint
ALTER TABLE "payments" ADD COLUMN "refund_due" text;--> statement-breakpoint
ALTER TABLE "payment_refunds" ADD CONSTRAINT "payment_refunds_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "payments" ADD CONSTRAINT "payments_operation_id_id_key" UNIQUE("operation_id","id");--> statement-breakpoint
ALTER TABLE "payment_refunds" ADD CONSTRAINT "payment_refunds_payment_fk" FOREIGN KEY ("operation_id","payment_id") REFERENCES "public"."payments"("operation_id","id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "payment_refunds_payment_idx" ON "payment_refunds" USING btree ("operation_id","payment_id");--> statement-breakpoint
ALTER TABLE "payments" ADD CONSTRAINT "payments_amount_refunded_check" CHECK ("payments"."amount_refunded" >= 0 and "payments"."amount_refunded" <= "payments"."amount");