CREATE TABLE "vessel" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"project_id" uuid NOT NULL,
	"name" text NOT NULL,
	"raos" jsonb,
	"rao_file_name" text,
	"rao_imported_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "operation" ADD COLUMN "vessel_id" uuid;--> statement-breakpoint
ALTER TABLE "operation" ADD COLUMN "heading_deg" double precision;--> statement-breakpoint
ALTER TABLE "vessel" ADD CONSTRAINT "vessel_project_id_project_id_fk" FOREIGN KEY ("project_id") REFERENCES "public"."project"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "vessel_project_id_index" ON "vessel" USING btree ("project_id");--> statement-breakpoint
ALTER TABLE "operation" ADD CONSTRAINT "operation_vessel_id_vessel_id_fk" FOREIGN KEY ("vessel_id") REFERENCES "public"."vessel"("id") ON DELETE set null ON UPDATE no action;