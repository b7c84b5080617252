CREATE TYPE "public"."build_sheet_status" AS ENUM('draft', 'approved', 'released', 'superseded');--> statement-breakpoint
CREATE TYPE "public"."conductor" AS ENUM('copper', 'aluminium');--> statement-breakpoint
CREATE TYPE "public"."wire_standard" AS ENUM('AWG', 'metric');--> statement-breakpoint
CREATE TYPE "public"."work_order_stage" AS ENUM('engineering', 'ready', 'winding', 'terminating', 'impregnating', 'curing', 'testing', 'inspection', 'packing', 'shipped', 'on_hold', 'rework');--> statement-breakpoint
CREATE SEQUENCE "public"."work_order_number_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 9223372036854775807 START WITH 1 CACHE 1;--> statement-breakpoint
CREATE TABLE "build_sheets" (
	"id" serial PRIMARY KEY NOT NULL,
	"line_id" integer NOT NULL,
	"version" integer NOT NULL,
	"status" "build_sheet_status" DEFAULT 'draft' NOT NULL,
	"spec" jsonb NOT NULL,
	"target" jsonb,
	"result" jsonb NOT NULL,
	"engine_version" varchar(20) NOT NULL,
	"notes" text DEFAULT '' NOT NULL,
	"override_reason" text,
	"short_stock_note" text,
	"drafted_by" integer,
	"drafted_at" timestamp with time zone DEFAULT now() NOT NULL,
	"approved_by" integer,
	"approved_at" timestamp with time zone,
	"released_by" integer,
	"released_at" timestamp with time zone,
	"superseded_at" timestamp with time zone
);
--> statement-breakpoint
CREATE TABLE "spool_reservations" (
	"id" serial PRIMARY KEY NOT NULL,
	"spool_id" integer NOT NULL,
	"work_order_id" integer NOT NULL,
	"mass" double precision NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "spools" (
	"id" serial PRIMARY KEY NOT NULL,
	"conductor" "conductor" NOT NULL,
	"wire_standard" "wire_standard" NOT NULL,
	"awg_gauge" integer,
	"diameter" double precision,
	"insulation_grade" integer NOT NULL,
	"supplier" varchar(120) NOT NULL,
	"lot" varchar(60) NOT NULL,
	"net_mass" double precision NOT NULL,
	"location" varchar(80) DEFAULT '' NOT NULL,
	"received_at" timestamp with time zone DEFAULT now() NOT NULL,
	"received_by" integer,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "work_order_events" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"work_order_id" integer NOT NULL,
	"at" timestamp with time zone DEFAULT now() NOT NULL,
	"user_id" integer,
	"from_stage" "work_order_stage",
	"to_stage" "work_order_stage" NOT NULL,
	"note" text DEFAULT '' NOT NULL,
	"station_id" integer
);
--> statement-breakpoint
CREATE TABLE "work_orders" (
	"id" serial PRIMARY KEY NOT NULL,
	"number" varchar(24) NOT NULL,
	"order_id" integer NOT NULL,
	"line_id" integer NOT NULL,
	"build_sheet_id" integer NOT NULL,
	"stage" "work_order_stage" DEFAULT 'ready' NOT NULL,
	"quantity" integer NOT NULL,
	"due_date" date NOT NULL,
	"priority" integer DEFAULT 0 NOT NULL,
	"assignee_id" integer,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "build_sheets" ADD CONSTRAINT "build_sheets_line_id_order_lines_id_fk" FOREIGN KEY ("line_id") REFERENCES "public"."order_lines"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "build_sheets" ADD CONSTRAINT "build_sheets_drafted_by_users_id_fk" FOREIGN KEY ("drafted_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "build_sheets" ADD CONSTRAINT "build_sheets_approved_by_users_id_fk" FOREIGN KEY ("approved_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "build_sheets" ADD CONSTRAINT "build_sheets_released_by_users_id_fk" FOREIGN KEY ("released_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "spool_reservations" ADD CONSTRAINT "spool_reservations_spool_id_spools_id_fk" FOREIGN KEY ("spool_id") REFERENCES "public"."spools"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "spool_reservations" ADD CONSTRAINT "spool_reservations_work_order_id_work_orders_id_fk" FOREIGN KEY ("work_order_id") REFERENCES "public"."work_orders"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "spools" ADD CONSTRAINT "spools_received_by_users_id_fk" FOREIGN KEY ("received_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "work_order_events" ADD CONSTRAINT "work_order_events_work_order_id_work_orders_id_fk" FOREIGN KEY ("work_order_id") REFERENCES "public"."work_orders"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "work_order_events" ADD CONSTRAINT "work_order_events_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "work_orders" ADD CONSTRAINT "work_orders_order_id_orders_id_fk" FOREIGN KEY ("order_id") REFERENCES "public"."orders"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "work_orders" ADD CONSTRAINT "work_orders_line_id_order_lines_id_fk" FOREIGN KEY ("line_id") REFERENCES "public"."order_lines"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "work_orders" ADD CONSTRAINT "work_orders_build_sheet_id_build_sheets_id_fk" FOREIGN KEY ("build_sheet_id") REFERENCES "public"."build_sheets"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "work_orders" ADD CONSTRAINT "work_orders_assignee_id_users_id_fk" FOREIGN KEY ("assignee_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "build_sheets_line_version_unique" ON "build_sheets" USING btree ("line_id","version");--> statement-breakpoint
CREATE UNIQUE INDEX "build_sheets_one_released_per_line" ON "build_sheets" USING btree ("line_id") WHERE "build_sheets"."status" = 'released';--> statement-breakpoint
CREATE INDEX "spool_reservations_spool_idx" ON "spool_reservations" USING btree ("spool_id");--> statement-breakpoint
CREATE INDEX "spool_reservations_wo_idx" ON "spool_reservations" USING btree ("work_order_id");--> statement-breakpoint
CREATE INDEX "spools_wire_idx" ON "spools" USING btree ("conductor","wire_standard","awg_gauge","diameter","insulation_grade","received_at");--> statement-breakpoint
CREATE INDEX "work_order_events_wo_idx" ON "work_order_events" USING btree ("work_order_id","at");--> statement-breakpoint
CREATE UNIQUE INDEX "work_orders_number_unique" ON "work_orders" USING btree ("number");--> statement-breakpoint
CREATE INDEX "work_orders_stage_due_idx" ON "work_orders" USING btree ("stage","due_date");--> statement-breakpoint
CREATE INDEX "work_orders_order_idx" ON "work_orders" USING btree ("order_id");--> statement-breakpoint
CREATE INDEX "work_orders_line_idx" ON "work_orders" USING btree ("line_id");