import { sql } from 'drizzle-orm';
import {
  bigint,
  bigserial,
  boolean,
  char,
  date,
  doublePrecision,
  index,
  integer,
  json,
  type AnyPgColumn,
  jsonb,
  pgEnum,
  pgSequence,
  pgTable,
  serial,
  text,
  timestamp,
  uniqueIndex,
  varchar,
} from 'drizzle-orm/pg-core';
import { ROLES } from '../../src/contracts/roles';
import { NOTIFICATION_STATUSES } from '../../src/contracts/jobs';
import { LENGTH_UNITS, TEMPERATURE_UNITS } from '../../src/contracts/auth';
import type { Address } from '../../src/contracts/customers';
import { ORDER_EVENT_KINDS, ORDER_STATUSES, type Requirement } from '../../src/contracts/orders';
import type { CoilSpec, CoilTarget } from '../../src/contracts/coil';
import { BUILD_SHEET_STATUSES } from '../../src/contracts/build-sheet-status';
import { STAGES } from '../../src/contracts/stages';
import { CONDUCTORS, WIRE_STANDARDS, type Conductor } from '../../src/contracts/stock';
import { PRIORITY_DEFAULT, WORK_ORDER_EVENT_KINDS } from '../../src/contracts/work-orders';
import { STATION_KINDS } from '../../src/contracts/floor';
import { DISPOSITION_ACTIONS, INSTRUMENT_KINDS, NONCONFORMANCE_STATES, type Reading, type RecordTestRequest } from '../../src/contracts/test-records';
import { SHIPMENT_DOCUMENT_KINDS, type PackageInput } from '../../src/contracts/shipments';
import type { BuildSheet } from '../coil/types';

export const roleEnum = pgEnum('role', ROLES);
export const lengthUnitEnum = pgEnum('length_unit', LENGTH_UNITS);
export const temperatureUnitEnum = pgEnum('temperature_unit', TEMPERATURE_UNITS);

const timestamps = {
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
};

const EMPTY_ADDRESS_SQL = sql`'{"line1":"","line2":"","city":"","region":"","postalCode":"","country":""}'::jsonb`;

/** Customer companies, their addresses and internal notes; contacts in customer_contacts. */
export const customers = pgTable(
  'customers',
  {
    id: serial('id').primaryKey(),
    name: varchar('name', { length: 160 }).notNull(),
    /** Internal notes; never shown to the customer. */
    notes: text('notes').notNull().default(''),
    ...timestamps,
    billingAddress: jsonb('billing_address').$type<Address>().notNull().default(EMPTY_ADDRESS_SQL),
    /** null: ship to the billing address. */
    shippingAddress: jsonb('shipping_address').$type<Address>(),
  },
  (t) => [uniqueIndex('customers_name_unique').on(sql`lower(${t.name})`)],
);

export const users = pgTable(
  'users',
  {
    id: serial('id').primaryKey(),
    /** Stored lower-cased; unique regardless of case. */
    email: varchar('email', { length: 254 }).notNull(),
    name: varchar('name', { length: 120 }).notNull(),
    role: roleEnum('role').notNull(),
    passwordHash: text('password_hash').notNull(),
    active: boolean('active').notNull().default(true),
    customerId: integer('customer_id').references(() => customers.id, { onDelete: 'restrict' }),
    lengthUnit: lengthUnitEnum('length_unit').notNull().default('mm'),
    temperatureUnit: temperatureUnitEnum('temperature_unit').notNull().default('C'),
    lastLoginAt: timestamp('last_login_at', { withTimezone: true }),
    /** Set for an account whose password someone else chose (the first admin from `npm run setup`): every other route refuses until it is changed. */
    mustChangePassword: boolean('must_change_password').notNull().default(false),
    ...timestamps,
  },
  (t) => [uniqueIndex('users_email_unique').on(sql`lower(${t.email})`), index('users_customer_idx').on(t.customerId)],
);

/** Sessions, in the table layout connect-pg-simple reads and writes. */
export const sessions = pgTable(
  'session',
  {
    sid: varchar('sid').primaryKey(),
    sess: json('sess').notNull(),
    expire: timestamp('expire', { precision: 6 }).notNull(),
  },
  (t) => [index('IDX_session_expire').on(t.expire)],
);

/** Small facts about this installation (for example which seed steps have run). */
export const appMeta = pgTable('app_meta', {
  key: varchar('key', { length: 80 }).primaryKey(),
  value: text('value').notNull(),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
});

/** People at a customer company, and which notices each receives. */
export const customerContacts = pgTable(
  'customer_contacts',
  {
    id: serial('id').primaryKey(),
    customerId: integer('customer_id')
      .notNull()
      .references(() => customers.id, { onDelete: 'cascade' }),
    /** Order in the company's list (the first contact is the fallback for order notices). */
    position: integer('position').notNull().default(0),
    name: varchar('name', { length: 120 }).notNull(),
    email: varchar('email', { length: 254 }).notNull().default(''),
    phone: varchar('phone', { length: 40 }).notNull().default(''),
    notifyOrders: boolean('notify_orders').notNull().default(false),
    notifyShipping: boolean('notify_shipping').notNull().default(false),
    ...timestamps,
  },
  (t) => [index('customer_contacts_customer_idx').on(t.customerId, t.position)],
);

export const orderStatusEnum = pgEnum('order_status', ORDER_STATUSES);
export const orderEventKindEnum = pgEnum('order_event_kind', ORDER_EVENT_KINDS);

/** Shop-wide order numbers: never reset, never reused (a rolled-back order leaves a gap). */
export const orderNumberSeq = pgSequence('order_number_seq', { startWith: 1001 });

export const orders = pgTable(
  'orders',
  {
    id: serial('id').primaryKey(),
    /** "SO-<year>-<sequence>", from order_number_seq. */
    number: varchar('number', { length: 24 }).notNull(),
    customerId: integer('customer_id')
      .notNull()
      .references(() => customers.id, { onDelete: 'restrict' }),
    /** The customer's purchase-order number; unique per customer, any case. */
    purchaseOrder: varchar('purchase_order', { length: 60 }).notNull(),
    orderDate: date('order_date', { mode: 'string' }).notNull(),
    /** Requested ship date. */
    dueDate: date('due_date', { mode: 'string' }).notNull(),
    /** Internal notes; never shown to the customer. */
    notes: text('notes').notNull().default(''),
    status: orderStatusEnum('status').notNull().default('entered'),
    acknowledgedAt: timestamp('acknowledged_at', { withTimezone: true }),
    acknowledgedBy: integer('acknowledged_by').references(() => users.id, { onDelete: 'set null' }),
    cancelledAt: timestamp('cancelled_at', { withTimezone: true }),
    cancelledBy: integer('cancelled_by').references(() => users.id, { onDelete: 'set null' }),
    cancelReason: text('cancel_reason'),
    createdBy: integer('created_by').references(() => users.id, { onDelete: 'set null' }),
    ...timestamps,
  },
  (t) => [
    uniqueIndex('orders_number_unique').on(t.number),
    uniqueIndex('orders_customer_po_unique').on(t.customerId, sql`lower(${t.purchaseOrder})`),
    index('orders_status_due_idx').on(t.status, t.dueDate),
  ],
);

export const orderLines = pgTable(
  'order_lines',
  {
    id: serial('id').primaryKey(),
    orderId: integer('order_id')
      .notNull()
      .references(() => orders.id, { onDelete: 'cascade' }),
    lineNo: integer('line_no').notNull(),
    quantity: integer('quantity').notNull(),
    title: varchar('title', { length: 200 }).notNull(),
    customerPartNumber: varchar('customer_part_number', { length: 80 }).notNull().default(''),
    /** What the customer states, SI, validated by RequirementSchema (src/contracts/orders.ts). */
    requirement: jsonb('requirement').$type<Requirement>().notNull(),
    /** ± % on the resistance at 20 °C. */
    tolerancePercent: doublePrecision('tolerance_percent').notNull().default(10),
    terminationNotes: text('termination_notes').notNull().default(''),
    leadNotes: text('lead_notes').notNull().default(''),
    ...timestamps,
  },
  (t) => [uniqueIndex('order_lines_order_line_no_unique').on(t.orderId, t.lineNo)],
);

/** The audit trail of an order: who changed what, when (field → [old, new]). Never rewritten. */
export const orderEvents = pgTable(
  'order_events',
  {
    id: bigserial('id', { mode: 'number' }).primaryKey(),
    orderId: integer('order_id')
      .notNull()
      .references(() => orders.id, { onDelete: 'cascade' }),
    at: timestamp('at', { withTimezone: true }).notNull().defaultNow(),
    actorId: integer('actor_id').references(() => users.id, { onDelete: 'set null' }),
    kind: orderEventKindEnum('kind').notNull(),
    changes: jsonb('changes').$type<Record<string, [unknown, unknown]>>().notNull().default(sql`'{}'::jsonb`),
    note: text('note'),
  },
  (t) => [index('order_events_order_idx').on(t.orderId, t.at)],
);

/** Drawings and specs, stored in the object store under storage_key; this row is the index. */
export const attachments = pgTable(
  'attachments',
  {
    id: serial('id').primaryKey(),
    orderId: integer('order_id')
      .notNull()
      .references(() => orders.id, { onDelete: 'restrict' }),
    /** The line it belongs to; null for the whole order (or when its line was removed). */
    lineId: integer('line_id').references(() => orderLines.id, { onDelete: 'set null' }),
    filename: varchar('filename', { length: 255 }).notNull(),
    /** Decided from the content, not the name. */
    contentType: varchar('content_type', { length: 100 }).notNull(),
    size: integer('size').notNull(),
    sha256: char('sha256', { length: 64 }).notNull(),
    storageKey: varchar('storage_key', { length: 300 }).notNull(),
    uploadedBy: integer('uploaded_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('attachments_order_idx').on(t.orderId), uniqueIndex('attachments_storage_key_unique').on(t.storageKey)],
);

export const notificationStatusEnum = pgEnum('notification_status', NOTIFICATION_STATUSES);
export type NotificationRecipient = { name: string; email: string };

/**
 * Outbox of messages to send (e-mail today). A business change writes its row in its own
 * transaction; a worker delivers rows whose status is 'pending' and whose due_at has come.
 * 'skipped' rows record a notice that had nobody to go to, with the reason.
 */
export const notifications = pgTable(
  'notifications',
  {
    id: bigserial('id', { mode: 'number' }).primaryKey(),
    /** What to say, e.g. 'order_acknowledged'; the worker picks a template by kind. */
    kind: varchar('kind', { length: 60 }).notNull(),
    recipients: jsonb('recipients').$type<NotificationRecipient[]>().notNull().default(sql`'[]'::jsonb`),
    orderId: integer('order_id').references(() => orders.id, { onDelete: 'set null' }),
    /** Everything the message needs, captured when it was asked for. */
    payload: jsonb('payload').$type<Record<string, unknown>>().notNull().default(sql`'{}'::jsonb`),
    status: notificationStatusEnum('status').notNull().default('pending'),
    /** Why it was skipped (or gave up), in words. */
    reason: text('reason'),
    attempts: integer('attempts').notNull().default(0),
    lastError: text('last_error'),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    /** Not before this time (retries push it later). */
    dueAt: timestamp('due_at', { withTimezone: true }).notNull().defaultNow(),
    sentAt: timestamp('sent_at', { withTimezone: true }),
    /** The mail server's message id once sent. */
    messageId: varchar('message_id', { length: 300 }),
  },
  (t) => [index('notifications_due_idx').on(t.status, t.dueAt), index('notifications_order_idx').on(t.orderId)],
);

// ── Build sheets, work orders, wire stock ──────────────────────────────────────────────────

export const buildSheetStatusEnum = pgEnum('build_sheet_status', BUILD_SHEET_STATUSES);

/**
 * Versions of how to wind one order line: the spec (SI), the engine's full result as computed
 * then, and who drafted, approved and released it. Approved and released rows never change
 * (a change is a new draft version); a released one becomes superseded when a newer version of
 * the line is released. At most one released version per line.
 */
export const buildSheets = pgTable(
  'build_sheets',
  {
    id: serial('id').primaryKey(),
    lineId: integer('line_id')
      .notNull()
      .references(() => orderLines.id, { onDelete: 'cascade' }),
    /** 1, 2, 3 … per line. */
    version: integer('version').notNull(),
    status: buildSheetStatusEnum('status').notNull().default('draft'),
    spec: jsonb('spec').$type<CoilSpec>().notNull(),
    /** The solve target the engineer worked to, if any. */
    target: jsonb('target').$type<CoilTarget>(),
    /** The engine's BuildSheet as computed when drafted; never recomputed. */
    result: jsonb('result').$type<BuildSheet>().notNull(),
    engineVersion: varchar('engine_version', { length: 20 }).notNull(),
    notes: text('notes').notNull().default(''),
    overrideReason: text('override_reason'),
    /** Why it was released although the wire stock was short. */
    shortStockNote: text('short_stock_note'),
    draftedBy: integer('drafted_by').references(() => users.id, { onDelete: 'set null' }),
    draftedAt: timestamp('drafted_at', { withTimezone: true }).notNull().defaultNow(),
    approvedBy: integer('approved_by').references(() => users.id, { onDelete: 'set null' }),
    approvedAt: timestamp('approved_at', { withTimezone: true }),
    releasedBy: integer('released_by').references(() => users.id, { onDelete: 'set null' }),
    releasedAt: timestamp('released_at', { withTimezone: true }),
    supersededAt: timestamp('superseded_at', { withTimezone: true }),
  },
  (t) => [
    uniqueIndex('build_sheets_line_version_unique').on(t.lineId, t.version),
    uniqueIndex('build_sheets_one_released_per_line').on(t.lineId).where(sql`${t.status} = 'released'`),
  ],
);

export const workOrderStageEnum = pgEnum('work_order_stage', STAGES);

/** Shop-wide work-order numbers: never reset, never reused (a rolled-back release leaves a gap). */
export const workOrderNumberSeq = pgSequence('work_order_number_seq', { startWith: 1 });

/** A batch of one line's units released from a build sheet; it travels the shop through the stages. */
export const workOrders = pgTable(
  'work_orders',
  {
    id: serial('id').primaryKey(),
    /** "WO-<yy>-<sequence>", from work_order_number_seq. */
    number: varchar('number', { length: 24 }).notNull(),
    orderId: integer('order_id')
      .notNull()
      .references(() => orders.id, { onDelete: 'restrict' }),
    lineId: integer('line_id')
      .notNull()
      .references(() => orderLines.id, { onDelete: 'restrict' }),
    buildSheetId: integer('build_sheet_id')
      .notNull()
      .references(() => buildSheets.id, { onDelete: 'restrict' }),
    stage: workOrderStageEnum('stage').notNull().default('ready'),
    quantity: integer('quantity').notNull(),
    dueDate: date('due_date', { mode: 'string' }).notNull(),
    /** Higher goes first (PRIORITIES in src/contracts/work-orders.ts). */
    priority: integer('priority').notNull().default(PRIORITY_DEFAULT),
    assigneeId: integer('assignee_id').references(() => users.id, { onDelete: 'set null' }),
    /** The station it is assigned to (floor). */
    stationId: integer('station_id').references((): AnyPgColumn => stations.id, { onDelete: 'restrict' }),
    /** Optimistic locking: every change bumps it; a change naming an older one is refused. */
    version: integer('version').notNull().default(1),
    ...timestamps,
  },
  (t) => [
    uniqueIndex('work_orders_number_unique').on(t.number),
    index('work_orders_stage_due_idx').on(t.stage, t.dueDate),
    index('work_orders_order_idx').on(t.orderId),
    index('work_orders_line_idx').on(t.lineId),
    index('work_orders_assignee_idx').on(t.assigneeId),
    index('work_orders_station_idx').on(t.stationId),
    // The board: a column in the order the foreman works it (priority high first, due date, id);
    // the keyset cursor compares ((-priority), due_date, id) against the last card's.
    index('work_orders_board_idx').on(t.stage, sql`(-${t.priority})`, t.dueDate, t.id),
  ],
);

export const workOrderEventKindEnum = pgEnum('work_order_event_kind', WORK_ORDER_EVENT_KINDS);

/** Every stage a work order entered (the release: from null to ready), assignment and priority change. Never rewritten. */
export const workOrderEvents = pgTable(
  'work_order_events',
  {
    id: bigserial('id', { mode: 'number' }).primaryKey(),
    workOrderId: integer('work_order_id')
      .notNull()
      .references(() => workOrders.id, { onDelete: 'cascade' }),
    at: timestamp('at', { withTimezone: true }).notNull().defaultNow(),
    userId: integer('user_id').references(() => users.id, { onDelete: 'set null' }),
    fromStage: workOrderStageEnum('from_stage'),
    toStage: workOrderStageEnum('to_stage').notNull(),
    note: text('note').notNull().default(''),
    /** The station it happened at. */
    stationId: integer('station_id').references((): AnyPgColumn => stations.id, { onDelete: 'restrict' }),
    /** release, move (stage change), assign or priority; assign and priority keep the stage (from = to). */
    kind: workOrderEventKindEnum('kind').notNull().default('move'),
    /** Assignment events: the person assigned (null = nobody). */
    assigneeId: integer('assignee_id').references(() => users.id, { onDelete: 'set null' }),
    /** Leaving winding: the turns counter reading and the spool lot actually used. */
    turnsCounter: integer('turns_counter'),
    spoolLot: varchar('spool_lot', { length: 60 }),
  },
  (t) => [index('work_order_events_wo_idx').on(t.workOrderId, t.at)],
);

export const conductorEnum = pgEnum('conductor', CONDUCTORS as [Conductor, ...Conductor[]]);
export const wireStandardEnum = pgEnum('wire_standard', WIRE_STANDARDS);

/** Spools of magnet wire in stock. Masses in kg; a metric size's diameter in m. */
export const spools = pgTable(
  'spools',
  {
    id: serial('id').primaryKey(),
    conductor: conductorEnum('conductor').notNull(),
    wireStandard: wireStandardEnum('wire_standard').notNull(),
    /** AWG sizes: the gauge number; null for metric. */
    awgGauge: integer('awg_gauge'),
    /** Metric sizes: nominal bare diameter, m; null for AWG. */
    diameter: doublePrecision('diameter'),
    insulationGrade: integer('insulation_grade').notNull(),
    supplier: varchar('supplier', { length: 120 }).notNull(),
    lot: varchar('lot', { length: 60 }).notNull(),
    /** Wire on the spool when received, kg. */
    netMass: doublePrecision('net_mass').notNull(),
    location: varchar('location', { length: 80 }).notNull().default(''),
    receivedAt: timestamp('received_at', { withTimezone: true }).notNull().defaultNow(),
    receivedBy: integer('received_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('spools_wire_idx').on(t.conductor, t.wireStandard, t.awgGauge, t.diameter, t.insulationGrade, t.receivedAt)],
);

/** Wire mass set aside on a spool for a work order, kg. Free mass = net mass − reservations. */
export const spoolReservations = pgTable(
  'spool_reservations',
  {
    id: serial('id').primaryKey(),
    spoolId: integer('spool_id')
      .notNull()
      .references(() => spools.id, { onDelete: 'restrict' }),
    workOrderId: integer('work_order_id')
      .notNull()
      .references(() => workOrders.id, { onDelete: 'cascade' }),
    mass: doublePrecision('mass').notNull(),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('spool_reservations_spool_idx').on(t.spoolId), index('spool_reservations_wo_idx').on(t.workOrderId)],
);

/**
 * A printed traveler: one PDF per work order and build sheet, kept in the object store with its
 * checksum. A newer build sheet on the work order makes the last traveler stale.
 */
export const travelers = pgTable(
  'travelers',
  {
    id: serial('id').primaryKey(),
    workOrderId: integer('work_order_id')
      .notNull()
      .references(() => workOrders.id, { onDelete: 'cascade' }),
    buildSheetId: integer('build_sheet_id')
      .notNull()
      .references(() => buildSheets.id, { onDelete: 'restrict' }),
    buildSheetVersion: integer('build_sheet_version').notNull(),
    storageKey: varchar('storage_key', { length: 300 }).notNull(),
    sha256: varchar('sha256', { length: 64 }).notNull(),
    size: integer('size').notNull(),
    pages: integer('pages').notNull(),
    paper: varchar('paper', { length: 8 }).notNull(),
    createdBy: integer('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex('travelers_wo_sheet_unique').on(t.workOrderId, t.buildSheetId)],
);

// ── The floor ──────────────────────────────────────────────────────────────────────────────

export const stationKindEnum = pgEnum('station_kind', STATION_KINDS);

/**
 * Winding machines, benches, ovens and test benches (admin-managed; retired with active = false,
 * never deleted: events point at them). Wire-size range as bare diameter, m; spindle in rev/min;
 * set-up per work order, s.
 */
export const stations = pgTable(
  'stations',
  {
    id: serial('id').primaryKey(),
    name: varchar('name', { length: 80 }).notNull(),
    kind: stationKindEnum('kind').notNull(),
    wireDiameterMin: doublePrecision('wire_diameter_min'),
    wireDiameterMax: doublePrecision('wire_diameter_max'),
    spindleRpm: doublePrecision('spindle_rpm'),
    setupSeconds: integer('setup_seconds').notNull().default(0),
    active: boolean('active').notNull().default(true),
    ...timestamps,
  },
  (t) => [uniqueIndex('stations_name_unique').on(sql`lower(${t.name})`)],
);

// ── Test records ───────────────────────────────────────────────────────────────────────────

export const instrumentKindEnum = pgEnum('instrument_kind', INSTRUMENT_KINDS);

/** Test instruments with their calibration due date (a reading with an overdue one is refused). */
export const instruments = pgTable(
  'instruments',
  {
    id: serial('id').primaryKey(),
    name: varchar('name', { length: 120 }).notNull(),
    kind: instrumentKindEnum('kind').notNull(),
    serial: varchar('serial', { length: 80 }).notNull(),
    calibrationDue: date('calibration_due', { mode: 'string' }).notNull(),
    active: boolean('active').notNull().default(true),
    ...timestamps,
  },
  (t) => [uniqueIndex('instruments_kind_serial_unique').on(t.kind, sql`lower(${t.serial})`)],
);

/**
 * One test of one unit (serial) of a work order: the readings as entered, the derived values,
 * the limits used and the verdict. Never updated; a retest is a new row pointing at the earlier one.
 * A serial's first test (retest_of_id null) is unique within the work order.
 */
export const testRecords = pgTable(
  'test_records',
  {
    id: serial('id').primaryKey(),
    workOrderId: integer('work_order_id')
      .notNull()
      .references(() => workOrders.id, { onDelete: 'restrict' }),
    /** The build sheet judged against (the work order's at the time). */
    buildSheetId: integer('build_sheet_id')
      .notNull()
      .references(() => buildSheets.id, { onDelete: 'restrict' }),
    serial: varchar('serial', { length: 60 }).notNull(),
    retestOfId: integer('retest_of_id').references((): AnyPgColumn => testRecords.id, { onDelete: 'restrict' }),
    resistance: doublePrecision('resistance').notNull(),
    temperature: doublePrecision('temperature').notNull(),
    resistance20: doublePrecision('resistance20').notNull(),
    nominalResistance20: doublePrecision('nominal_resistance20').notNull(),
    tolerancePercent: doublePrecision('tolerance_percent').notNull(),
    deviationPercent: doublePrecision('deviation_percent').notNull(),
    deviationOhms: doublePrecision('deviation_ohms').notNull(),
    passed: boolean('passed').notNull(),
    reasons: jsonb('reasons').$type<string[]>().notNull(),
    readings: jsonb('readings').$type<Reading[]>().notNull(),
    entered: jsonb('entered').$type<RecordTestRequest>().notNull(),
    instrumentIds: jsonb('instrument_ids').$type<number[]>().notNull().default(sql`'[]'::jsonb`),
    /** The work order's station when tested (its winding station in practice). */
    stationId: integer('station_id').references(() => stations.id, { onDelete: 'restrict' }),
    testedBy: integer('tested_by').references(() => users.id, { onDelete: 'set null' }),
    testedAt: timestamp('tested_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index('test_records_wo_idx').on(t.workOrderId, t.serial),
    uniqueIndex('test_records_first_serial_unique').on(t.workOrderId, t.serial).where(sql`${t.retestOfId} is null`),
    index('test_records_tested_at_idx').on(t.testedAt),
  ],
);

export const nonconformanceStateEnum = pgEnum('nonconformance_state', NONCONFORMANCE_STATES);
export const dispositionActionEnum = pgEnum('disposition_action', DISPOSITION_ACTIONS);

/** A failed test record opens one: what failed and by how much. The state follows its disposition. */
export const nonconformances = pgTable(
  'nonconformances',
  {
    id: serial('id').primaryKey(),
    workOrderId: integer('work_order_id')
      .notNull()
      .references(() => workOrders.id, { onDelete: 'restrict' }),
    testRecordId: integer('test_record_id')
      .notNull()
      .references(() => testRecords.id, { onDelete: 'restrict' }),
    serial: varchar('serial', { length: 60 }).notNull(),
    summary: text('summary').notNull(),
    failed: jsonb('failed').$type<{ name: Reading['name']; value: number; limit: string; reason: string }[]>().notNull(),
    state: nonconformanceStateEnum('state').notNull().default('open'),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex('nonconformances_record_unique').on(t.testRecordId), index('nonconformances_wo_idx').on(t.workOrderId, t.state)],
);

/** The one disposition of a nonconformance (never replaced); use as is adds the engineer's approval. */
export const dispositions = pgTable(
  'dispositions',
  {
    id: serial('id').primaryKey(),
    nonconformanceId: integer('nonconformance_id')
      .notNull()
      .references(() => nonconformances.id, { onDelete: 'restrict' }),
    action: dispositionActionEnum('action').notNull(),
    reason: text('reason').notNull(),
    returnTo: workOrderStageEnum('return_to'),
    decidedBy: integer('decided_by').references(() => users.id, { onDelete: 'set null' }),
    decidedAt: timestamp('decided_at', { withTimezone: true }).notNull().defaultNow(),
    approvedBy: integer('approved_by').references(() => users.id, { onDelete: 'set null' }),
    approvedAt: timestamp('approved_at', { withTimezone: true }),
    approvalNote: text('approval_note'),
  },
  (t) => [uniqueIndex('dispositions_nc_unique').on(t.nonconformanceId)],
);

// ── Shipping ───────────────────────────────────────────────────────────────────────────────

/** Shop-wide shipment numbers: never reset, never reused (a rolled-back shipment leaves a gap). */
export const shipmentNumberSeq = pgSequence('shipment_number_seq', { startWith: 1 });

/**
 * What left the building for one customer: where to, how (carrier, service, tracking), the
 * packages (SI: kg, mm) and who recorded it. The only way a work order reaches `shipped`.
 */
export const shipments = pgTable(
  'shipments',
  {
    id: serial('id').primaryKey(),
    /** "SH-<year>-<sequence>", from shipment_number_seq. */
    number: varchar('number', { length: 24 }).notNull(),
    customerId: integer('customer_id')
      .notNull()
      .references(() => customers.id, { onDelete: 'restrict' }),
    shipTo: jsonb('ship_to').$type<Address>().notNull(),
    attention: varchar('attention', { length: 120 }).notNull().default(''),
    carrier: varchar('carrier', { length: 60 }).notNull(),
    service: varchar('service', { length: 60 }).notNull().default(''),
    trackingNumber: varchar('tracking_number', { length: 80 }).notNull().default(''),
    shipDate: date('ship_date', { mode: 'string' }).notNull(),
    packages: jsonb('packages').$type<PackageInput[]>().notNull(),
    /** Printed on the packing list; the customer sees it. */
    packingNote: text('packing_note').notNull().default(''),
    /** The customer's shipment notice in the outbox. */
    notificationId: bigint('notification_id', { mode: 'number' }).references(() => notifications.id, { onDelete: 'set null' }),
    createdBy: integer('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex('shipments_number_unique').on(t.number),
    index('shipments_customer_idx').on(t.customerId, t.shipDate),
    index('shipments_ship_date_idx').on(t.shipDate),
  ],
);

/** The units of one work order in a shipment, by serial. A work order's shipped units are the sum of its items. */
export const shipmentItems = pgTable(
  'shipment_items',
  {
    id: serial('id').primaryKey(),
    shipmentId: integer('shipment_id')
      .notNull()
      .references(() => shipments.id, { onDelete: 'restrict' }),
    workOrderId: integer('work_order_id')
      .notNull()
      .references(() => workOrders.id, { onDelete: 'restrict' }),
    quantity: integer('quantity').notNull(),
    serials: text('serials').array().notNull(),
  },
  (t) => [uniqueIndex('shipment_items_shipment_wo_unique').on(t.shipmentId, t.workOrderId), index('shipment_items_wo_idx').on(t.workOrderId)],
);

export const shipmentDocumentKindEnum = pgEnum('shipment_document_kind', SHIPMENT_DOCUMENT_KINDS);

/** A shipment's drawn documents (packing list, certificate) in the object store: one row per kind. */
export const shipmentDocuments = pgTable(
  'shipment_documents',
  {
    id: serial('id').primaryKey(),
    shipmentId: integer('shipment_id')
      .notNull()
      .references(() => shipments.id, { onDelete: 'cascade' }),
    kind: shipmentDocumentKindEnum('kind').notNull(),
    storageKey: varchar('storage_key', { length: 300 }).notNull(),
    sha256: varchar('sha256', { length: 64 }).notNull(),
    size: integer('size').notNull(),
    pages: integer('pages').notNull(),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex('shipment_documents_shipment_kind_unique').on(t.shipmentId, t.kind)],
);

// ── Integrations ───────────────────────────────────────────────────────────────────────────

/**
 * API tokens for other systems (an ERP, a label printer script): issued by an admin, acting in
 * one role on behalf of the admin who issued it, revocable. Only the SHA-256 of the secret is kept;
 * the secret is shown once when issued.
 */
export const apiTokens = pgTable(
  'api_tokens',
  {
    id: serial('id').primaryKey(),
    name: varchar('name', { length: 80 }).notNull(),
    role: roleEnum('role').notNull(),
    /** SHA-256 of the whole secret, hex. */
    tokenHash: char('token_hash', { length: 64 }).notNull(),
    /** The secret's first characters, to tell tokens apart in lists and logs. */
    prefix: varchar('prefix', { length: 16 }).notNull(),
    issuedBy: integer('issued_by')
      .notNull()
      .references(() => users.id, { onDelete: 'restrict' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    lastUsedAt: timestamp('last_used_at', { withTimezone: true }),
    revokedAt: timestamp('revoked_at', { withTimezone: true }),
    revokedBy: integer('revoked_by').references(() => users.id, { onDelete: 'set null' }),
  },
  (t) => [uniqueIndex('api_tokens_hash_unique').on(t.tokenHash)],
);
