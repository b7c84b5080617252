CREATE TYPE "public"."station_kind" AS ENUM('winder', 'bench', 'oven', 'tester');--> statement-breakpoint
CREATE TYPE "public"."work_order_event_kind" AS ENUM('release', 'move', 'assign', 'priority');--> statement-breakpoint
CREATE TABLE "stations" (
	"id" serial PRIMARY KEY NOT NULL,
	"name" varchar(80) NOT NULL,
	"kind" "station_kind" NOT NULL,
	"wire_diameter_min" double precision,
	"wire_diameter_max" double precision,
	"spindle_rpm" double precision,
	"setup_seconds" integer DEFAULT 0 NOT NULL,
	"active" boolean DEFAULT true NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "work_order_events" ADD COLUMN "kind" "work_order_event_kind" DEFAULT 'move' NOT NULL;--> statement-breakpoint
ALTER TABLE "work_order_events" ADD COLUMN "assignee_id" integer;--> statement-breakpoint
ALTER TABLE "work_order_events" ADD COLUMN "turns_counter" integer;--> statement-breakpoint
ALTER TABLE "work_order_events" ADD COLUMN "spool_lot" varchar(60);--> statement-breakpoint
ALTER TABLE "work_orders" ADD COLUMN "station_id" integer;--> statement-breakpoint
-- Data: the release rows written before this migration are kind 'release'; no station existed, so any station_id set is an orphan the new foreign key would refuse.
UPDATE "work_order_events" SET "kind" = 'release' WHERE "from_stage" IS NULL;--> statement-breakpoint
UPDATE "work_order_events" SET "station_id" = NULL WHERE "station_id" IS NOT NULL;--> statement-breakpoint
CREATE UNIQUE INDEX "stations_name_unique" ON "stations" USING btree (lower("name"));--> statement-breakpoint
ALTER TABLE "work_order_events" ADD CONSTRAINT "work_order_events_station_id_stations_id_fk" FOREIGN KEY ("station_id") REFERENCES "public"."stations"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "work_order_events" ADD CONSTRAINT "work_order_events_assignee_id_users_id_fk" FOREIGN KEY ("assignee_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "work_orders" ADD CONSTRAINT "work_orders_station_id_stations_id_fk" FOREIGN KEY ("station_id") REFERENCES "public"."stations"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "work_orders_assignee_idx" ON "work_orders" USING btree ("assignee_id");--> statement-breakpoint
CREATE INDEX "work_orders_station_idx" ON "work_orders" USING btree ("station_id");