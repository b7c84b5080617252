CREATE TABLE "travelers" (
	"id" serial PRIMARY KEY NOT NULL,
	"work_order_id" integer NOT NULL,
	"build_sheet_id" integer NOT NULL,
	"build_sheet_version" integer NOT NULL,
	"storage_key" varchar(300) NOT NULL,
	"sha256" varchar(64) NOT NULL,
	"size" integer NOT NULL,
	"pages" integer NOT NULL,
	"paper" varchar(8) NOT NULL,
	"created_by" integer,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "travelers" ADD CONSTRAINT "travelers_work_order_id_work_orders_id_fk" FOREIGN KEY ("work_order_id") REFERENCES "public"."work_orders"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "travelers" ADD CONSTRAINT "travelers_build_sheet_id_build_sheets_id_fk" FOREIGN KEY ("build_sheet_id") REFERENCES "public"."build_sheets"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "travelers" ADD CONSTRAINT "travelers_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "travelers_wo_sheet_unique" ON "travelers" USING btree ("work_order_id","build_sheet_id");