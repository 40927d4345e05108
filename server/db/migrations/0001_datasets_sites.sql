CREATE TABLE "dataset" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"project_id" uuid NOT NULL,
	"name" text NOT NULL,
	"kind" text NOT NULL,
	"data_point_name" text DEFAULT '' NOT NULL,
	"data_point_latitude" double precision,
	"data_point_longitude" double precision,
	"data_point_depth_m" double precision,
	"source_kind" text NOT NULL,
	"original_file_name" text,
	"format" text,
	"issued_at" timestamp with time zone,
	"step_minutes" double precision NOT NULL,
	"start_at" timestamp with time zone NOT NULL,
	"end_at" timestamp with time zone NOT NULL,
	"record_count" integer NOT NULL,
	"variables" jsonb NOT NULL,
	"missing" jsonb NOT NULL,
	"derived" jsonb NOT NULL,
	"import_report" jsonb NOT NULL,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "dataset_chunk" (
	"dataset_id" uuid NOT NULL,
	"seq" integer NOT NULL,
	"start_at" timestamp with time zone NOT NULL,
	"end_at" timestamp with time zone NOT NULL,
	"count" integer NOT NULL,
	"time_ms" "bytea" NOT NULL,
	"hs" "bytea" NOT NULL,
	"tp" "bytea" NOT NULL,
	"tz" "bytea" NOT NULL,
	"te" "bytea" NOT NULL,
	"dir" "bytea" NOT NULL,
	"wind" "bytea" NOT NULL,
	"wind_dir" "bytea" NOT NULL,
	"given_periods" "bytea" NOT NULL,
	CONSTRAINT "dataset_chunk_dataset_id_seq_pk" PRIMARY KEY("dataset_id","seq")
);
--> statement-breakpoint
CREATE TABLE "audit_entry" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"project_id" uuid NOT NULL,
	"user_id" text,
	"user_name" text NOT NULL,
	"at" timestamp with time zone DEFAULT now() NOT NULL,
	"entity" text NOT NULL,
	"entity_id" text,
	"entity_name" text DEFAULT '' NOT NULL,
	"action" text NOT NULL,
	"before" jsonb,
	"after" jsonb
);
--> statement-breakpoint
CREATE TABLE "operation" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"project_id" uuid NOT NULL,
	"name" text NOT NULL,
	"description" text DEFAULT '' NOT NULL,
	"tpop_h" double precision NOT NULL,
	"tc_h" double precision DEFAULT 0 NOT NULL,
	"weather_restricted" boolean DEFAULT true NOT NULL,
	"limits" jsonb NOT NULL,
	"site_ids" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"skipper_ids" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"recurrence" jsonb,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "project_alpha" (
	"project_id" uuid PRIMARY KEY NOT NULL,
	"table" jsonb NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "worksite" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"project_id" uuid NOT NULL,
	"name" text NOT NULL,
	"latitude" double precision,
	"longitude" double precision,
	"depth_m" double precision NOT NULL,
	"shore_normal_deg" double precision,
	"breaker_index" double precision DEFAULT 0.6 NOT NULL,
	"time_zone" text DEFAULT 'UTC' NOT NULL,
	"hindcast_dataset_id" uuid,
	"transfer_table" jsonb,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "dataset" ADD CONSTRAINT "dataset_project_id_project_id_fk" FOREIGN KEY ("project_id") REFERENCES "public"."project"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "dataset" ADD CONSTRAINT "dataset_created_by_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "dataset_chunk" ADD CONSTRAINT "dataset_chunk_dataset_id_dataset_id_fk" FOREIGN KEY ("dataset_id") REFERENCES "public"."dataset"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "audit_entry" ADD CONSTRAINT "audit_entry_project_id_project_id_fk" FOREIGN KEY ("project_id") REFERENCES "public"."project"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "audit_entry" ADD CONSTRAINT "audit_entry_user_id_user_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "operation" ADD CONSTRAINT "operation_project_id_project_id_fk" FOREIGN KEY ("project_id") REFERENCES "public"."project"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "project_alpha" ADD CONSTRAINT "project_alpha_project_id_project_id_fk" FOREIGN KEY ("project_id") REFERENCES "public"."project"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "worksite" ADD CONSTRAINT "worksite_project_id_project_id_fk" FOREIGN KEY ("project_id") REFERENCES "public"."project"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "worksite" ADD CONSTRAINT "worksite_hindcast_dataset_id_dataset_id_fk" FOREIGN KEY ("hindcast_dataset_id") REFERENCES "public"."dataset"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "dataset_project_id_kind_issued_at_index" ON "dataset" USING btree ("project_id","kind","issued_at");--> statement-breakpoint
CREATE INDEX "audit_entry_project_id_at_index" ON "audit_entry" USING btree ("project_id","at");--> statement-breakpoint
CREATE INDEX "operation_project_id_index" ON "operation" USING btree ("project_id");--> statement-breakpoint
CREATE INDEX "worksite_project_id_index" ON "worksite" USING btree ("project_id");