CREATE TABLE "forecast_member" (
	"dataset_id" uuid NOT NULL,
	"member" integer NOT NULL,
	"seq" integer NOT NULL,
	"count" integer NOT NULL,
	"hs" "bytea" NOT NULL,
	"tp" "bytea" NOT NULL,
	"dir" "bytea" NOT NULL,
	"wind" "bytea" NOT NULL,
	"wind_dir" "bytea" NOT NULL,
	CONSTRAINT "forecast_member_dataset_id_member_seq_pk" PRIMARY KEY("dataset_id","member","seq")
);
--> statement-breakpoint
ALTER TABLE "dataset" ADD COLUMN "ensemble_members" integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE "subscription" ADD COLUMN "window_chance_below" integer;--> statement-breakpoint
ALTER TABLE "forecast_member" ADD CONSTRAINT "forecast_member_dataset_id_dataset_id_fk" FOREIGN KEY ("dataset_id") REFERENCES "public"."dataset"("id") ON DELETE cascade ON UPDATE no action;