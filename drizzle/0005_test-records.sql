CREATE TYPE "public"."disposition_action" AS ENUM('rework', 'scrap', 'use_as_is');--> statement-breakpoint
CREATE TYPE "public"."instrument_kind" AS ENUM('ohmmeter', 'hipot_tester', 'insulation_tester', 'lcr_meter', 'thermometer', 'force_gauge', 'turns_tester', 'other');--> statement-breakpoint
CREATE TYPE "public"."nonconformance_state" AS ENUM('open', 'awaiting_approval', 'dispositioned');--> statement-breakpoint
CREATE TABLE "dispositions" (
	"id" serial PRIMARY KEY NOT NULL,
	"nonconformance_id" integer NOT NULL,
	"action" "disposition_action" NOT NULL,
	"reason" text NOT NULL,
	"return_to" "work_order_stage",
	"decided_by" integer,
	"decided_at" timestamp with time zone DEFAULT now() NOT NULL,
	"approved_by" integer,
	"approved_at" timestamp with time zone,
	"approval_note" text
);
--> statement-breakpoint
CREATE TABLE "instruments" (
	"id" serial PRIMARY KEY NOT NULL,
	"name" varchar(120) NOT NULL,
	"kind" "instrument_kind" NOT NULL,
	"serial" varchar(80) NOT NULL,
	"calibration_due" date NOT NULL,
	"active" boolean DEFAULT true NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "nonconformances" (
	"id" serial PRIMARY KEY NOT NULL,
	"work_order_id" integer NOT NULL,
	"test_record_id" integer NOT NULL,
	"serial" varchar(60) NOT NULL,
	"summary" text NOT NULL,
	"failed" jsonb NOT NULL,
	"state" "nonconformance_state" DEFAULT 'open' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "test_records" (
	"id" serial PRIMARY KEY NOT NULL,
	"work_order_id" integer NOT NULL,
	"build_sheet_id" integer NOT NULL,
	"serial" varchar(60) NOT NULL,
	"retest_of_id" integer,
	"resistance" double precision NOT NULL,
	"temperature" double precision NOT NULL,
	"resistance20" double precision NOT NULL,
	"nominal_resistance20" double precision NOT NULL,
	"tolerance_percent" double precision NOT NULL,
	"deviation_percent" double precision NOT NULL,
	"deviation_ohms" double precision NOT NULL,
	"passed" boolean NOT NULL,
	"reasons" jsonb NOT NULL,
	"readings" jsonb NOT NULL,
	"entered" jsonb NOT NULL,
	"instrument_ids" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"station_id" integer,
	"tested_by" integer,
	"tested_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "dispositions" ADD CONSTRAINT "dispositions_nonconformance_id_nonconformances_id_fk" FOREIGN KEY ("nonconformance_id") REFERENCES "public"."nonconformances"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "dispositions" ADD CONSTRAINT "dispositions_decided_by_users_id_fk" FOREIGN KEY ("decided_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "dispositions" ADD CONSTRAINT "dispositions_approved_by_users_id_fk" FOREIGN KEY ("approved_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "nonconformances" ADD CONSTRAINT "nonconformances_work_order_id_work_orders_id_fk" FOREIGN KEY ("work_order_id") REFERENCES "public"."work_orders"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "nonconformances" ADD CONSTRAINT "nonconformances_test_record_id_test_records_id_fk" FOREIGN KEY ("test_record_id") REFERENCES "public"."test_records"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "test_records" ADD CONSTRAINT "test_records_work_order_id_work_orders_id_fk" FOREIGN KEY ("work_order_id") REFERENCES "public"."work_orders"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "test_records" ADD CONSTRAINT "test_records_build_sheet_id_build_sheets_id_fk" FOREIGN KEY ("build_sheet_id") REFERENCES "public"."build_sheets"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "test_records" ADD CONSTRAINT "test_records_retest_of_id_test_records_id_fk" FOREIGN KEY ("retest_of_id") REFERENCES "public"."test_records"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "test_records" ADD CONSTRAINT "test_records_station_id_stations_id_fk" FOREIGN KEY ("station_id") REFERENCES "public"."stations"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "test_records" ADD CONSTRAINT "test_records_tested_by_users_id_fk" FOREIGN KEY ("tested_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "dispositions_nc_unique" ON "dispositions" USING btree ("nonconformance_id");--> statement-breakpoint
CREATE UNIQUE INDEX "instruments_kind_serial_unique" ON "instruments" USING btree ("kind",lower("serial"));--> statement-breakpoint
CREATE UNIQUE INDEX "nonconformances_record_unique" ON "nonconformances" USING btree ("test_record_id");--> statement-breakpoint
CREATE INDEX "nonconformances_wo_idx" ON "nonconformances" USING btree ("work_order_id","state");--> statement-breakpoint
CREATE INDEX "test_records_wo_idx" ON "test_records" USING btree ("work_order_id","serial");--> statement-breakpoint
CREATE UNIQUE INDEX "test_records_first_serial_unique" ON "test_records" USING btree ("work_order_id","serial") WHERE "test_records"."retest_of_id" is null;--> statement-breakpoint
CREATE INDEX "test_records_tested_at_idx" ON "test_records" USING btree ("tested_at");