CREATE TYPE "public"."shipment_document_kind" AS ENUM('packing_list', 'certificate');--> statement-breakpoint
CREATE SEQUENCE "public"."shipment_number_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 9223372036854775807 START WITH 1 CACHE 1;--> statement-breakpoint
CREATE TABLE "shipment_documents" (
	"id" serial PRIMARY KEY NOT NULL,
	"shipment_id" integer NOT NULL,
	"kind" "shipment_document_kind" NOT NULL,
	"storage_key" varchar(300) NOT NULL,
	"sha256" varchar(64) NOT NULL,
	"size" integer NOT NULL,
	"pages" integer NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "shipment_items" (
	"id" serial PRIMARY KEY NOT NULL,
	"shipment_id" integer NOT NULL,
	"work_order_id" integer NOT NULL,
	"quantity" integer NOT NULL,
	"serials" text[] NOT NULL
);
--> statement-breakpoint
CREATE TABLE "shipments" (
	"id" serial PRIMARY KEY NOT NULL,
	"number" varchar(24) NOT NULL,
	"customer_id" integer NOT NULL,
	"ship_to" jsonb NOT NULL,
	"attention" varchar(120) DEFAULT '' NOT NULL,
	"carrier" varchar(60) NOT NULL,
	"service" varchar(60) DEFAULT '' NOT NULL,
	"tracking_number" varchar(80) DEFAULT '' NOT NULL,
	"ship_date" date NOT NULL,
	"packages" jsonb NOT NULL,
	"packing_note" text DEFAULT '' NOT NULL,
	"notification_id" bigint,
	"created_by" integer,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "shipment_documents" ADD CONSTRAINT "shipment_documents_shipment_id_shipments_id_fk" FOREIGN KEY ("shipment_id") REFERENCES "public"."shipments"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "shipment_items" ADD CONSTRAINT "shipment_items_shipment_id_shipments_id_fk" FOREIGN KEY ("shipment_id") REFERENCES "public"."shipments"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "shipment_items" ADD CONSTRAINT "shipment_items_work_order_id_work_orders_id_fk" FOREIGN KEY ("work_order_id") REFERENCES "public"."work_orders"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "shipments" ADD CONSTRAINT "shipments_customer_id_customers_id_fk" FOREIGN KEY ("customer_id") REFERENCES "public"."customers"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "shipments" ADD CONSTRAINT "shipments_notification_id_notifications_id_fk" FOREIGN KEY ("notification_id") REFERENCES "public"."notifications"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "shipments" ADD CONSTRAINT "shipments_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "shipment_documents_shipment_kind_unique" ON "shipment_documents" USING btree ("shipment_id","kind");--> statement-breakpoint
CREATE UNIQUE INDEX "shipment_items_shipment_wo_unique" ON "shipment_items" USING btree ("shipment_id","work_order_id");--> statement-breakpoint
CREATE INDEX "shipment_items_wo_idx" ON "shipment_items" USING btree ("work_order_id");--> statement-breakpoint
CREATE UNIQUE INDEX "shipments_number_unique" ON "shipments" USING btree ("number");--> statement-breakpoint
CREATE INDEX "shipments_customer_idx" ON "shipments" USING btree ("customer_id","ship_date");--> statement-breakpoint
CREATE INDEX "shipments_ship_date_idx" ON "shipments" USING btree ("ship_date");