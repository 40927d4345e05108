ALTER TABLE "dataset" ADD COLUMN "anemometer_height_m" double precision;--> statement-breakpoint
ALTER TABLE "dataset" ADD COLUMN "wind_exponent" double precision;