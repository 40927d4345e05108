CREATE TABLE "campaign_outlook" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"project_id" uuid NOT NULL,
	"campaign_id" uuid NOT NULL,
	"plan_run_id" uuid,
	"at" timestamp with time zone NOT NULL,
	"p50" timestamp with time zone,
	"p90" timestamp with time zone,
	"forecast_issued_at" timestamp with time zone,
	"samples" integer NOT NULL,
	"censored" integer NOT NULL
);
--> statement-breakpoint
ALTER TABLE "campaign" ADD COLUMN "planned_finish" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "campaign" ADD COLUMN "progress" jsonb DEFAULT '[]'::jsonb NOT NULL;--> statement-breakpoint
ALTER TABLE "subscription" ADD COLUMN "outlook_move_days" integer;--> statement-breakpoint
ALTER TABLE "campaign_outlook" ADD CONSTRAINT "campaign_outlook_project_id_project_id_fk" FOREIGN KEY ("project_id") REFERENCES "public"."project"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "campaign_outlook" ADD CONSTRAINT "campaign_outlook_campaign_id_campaign_id_fk" FOREIGN KEY ("campaign_id") REFERENCES "public"."campaign"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "campaign_outlook" ADD CONSTRAINT "campaign_outlook_plan_run_id_plan_run_id_fk" FOREIGN KEY ("plan_run_id") REFERENCES "public"."plan_run"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "campaign_outlook_campaign_id_at_index" ON "campaign_outlook" USING btree ("campaign_id","at");