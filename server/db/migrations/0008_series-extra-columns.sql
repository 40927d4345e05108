ALTER TABLE "dataset_chunk" ADD COLUMN "extra_columns" jsonb DEFAULT '[]'::jsonb NOT NULL;--> statement-breakpoint
ALTER TABLE "dataset_chunk" ADD COLUMN "extra" "bytea";