ALTER TABLE "square_up_transfers" ADD COLUMN "position" integer NOT NULL;--> statement-breakpoint
ALTER TABLE "square_ups" ADD COLUMN "fixed_costs_by" text DEFAULT 'ownership' NOT NULL;--> statement-breakpoint
ALTER TABLE "square_up_transfers" ADD CONSTRAINT "square_up_transfers_square_up_position_key" UNIQUE("square_up_id","position");--> statement-breakpoint
ALTER TABLE "square_ups" ADD CONSTRAINT "square_ups_fixed_costs_by_check" CHECK ("square_ups"."fixed_costs_by" in ('ownership', 'use'));