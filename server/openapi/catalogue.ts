/**
 * What the API document says about each route: its group, a sentence, and the contract schemas of
 * its query, body and answer. Who may call it is read from the route's own access rule at run
 * time. Every route the app mounts has an entry here (tests/api/openapi.test.ts compares them).
 */
import { z, type ZodType } from 'zod';
import { loginRequest, sessionResponse } from '../../src/contracts/auth';
import { approveBuildSheetRequest, buildSheetRecord, draftBuildSheetRequest, engineeringQueueResponse, orderLineDetail, releaseBuildSheetRequest, releaseResponse } from '../../src/contracts/build-sheets';
import { CoilSolveRequestSchema, CoilSpecSchema, coilProfileResponse, coilReferenceResponse } from '../../src/contracts/coil';
import { createCustomerRequest, customerDetail, customerSummary, listCustomersQuery, updateCustomerRequest } from '../../src/contracts/customers';
import { assignWorkOrdersRequest, createStationRequest, floorLoad, floorLoadQuery, listStationsQuery, moveWorkOrderRequest, myWorkResponse, stationRecord, updateStationRequest, updateWorkOrderRequest } from '../../src/contracts/floor';
import { IMPORT_KINDS, IMPORT_LABELS, importColumnsResponse, importCommitted, importReport } from '../../src/contracts/imports';
import { failedJob, jobStateResponse, listOutboxQuery, notificationRecord, outboxResponse } from '../../src/contracts/jobs';
import { attachmentCreated, cancelOrderRequest, createOrderRequest, listOrdersQuery, orderDetail, orderListResponse, updateOrderRequest } from '../../src/contracts/orders';
import { adoptHeatTransferRequest, shopSettings, updateShopSettingsRequest } from '../../src/contracts/settings';
import { createShipmentRequest, listShipmentsQuery } from '../../src/contracts/shipments';
import { listSpoolsQuery, receiveSpoolRequest, spoolListResponse, spoolRecord, stockCheck } from '../../src/contracts/stock';
import { approveRequest, createInstrumentRequest, dispositionRequest, recordTestRequest, serialsRequest, updateInstrumentRequest } from '../../src/contracts/test-records';
import { issueTokenRequest, issueTokenResponse, apiTokenRecord, tokenListResponse } from '../../src/contracts/tokens';
import { travelerBatchRequest, travelerInfo, travelerJobAccepted } from '../../src/contracts/travelers';
import { boardColumn, boardColumnQuery, boardQuery, boardResponse } from '../../src/contracts/board';
import { changePasswordRequest, createUserRequest, customerOption, updatePreferencesRequest, updateUserRequest, userRecord } from '../../src/contracts/users';
import { listWorkOrdersQuery, workOrderDetail, workOrderListResponse } from '../../src/contracts/work-orders';

export type Operation = {
  tag: string;
  summary: string;
  description?: string;
  query?: ZodType;
  /** A JSON body. */
  body?: ZodType;
  /** A multipart/form-data body: the file field and the other fields' schema. */
  upload?: { file: string; fields?: ZodType };
  /** The success answer: a schema for JSON, or a media type for files and streams. */
  response?: ZodType | 'pdf' | 'csv' | 'event-stream' | 'prometheus' | 'binary' | 'empty';
  status?: number;
};

const obj = (shape: Record<string, ZodType>) => z.object(shape);

const IMPORT_OPS: Record<string, Operation> = Object.fromEntries(
  IMPORT_KINDS.flatMap((kind) => [
    [`GET /api/imports/${kind}/columns`, { tag: 'Imports', summary: `${IMPORT_LABELS[kind]}: the columns of the CSV, in your units`, response: importColumnsResponse }],
    [`GET /api/imports/${kind}/template.csv`, { tag: 'Imports', summary: `${IMPORT_LABELS[kind]}: the template (header row, in your units)`, response: 'csv' }],
    [
      `POST /api/imports/${kind}/dry-run`,
      { tag: 'Imports', summary: `${IMPORT_LABELS[kind]}: check a CSV row by row; nothing is written`, upload: { file: 'file' }, response: importReport },
    ],
    [
      `POST /api/imports/${kind}/commit`,
      {
        tag: 'Imports',
        summary: `${IMPORT_LABELS[kind]}: import a CSV in one transaction`,
        description: 'Refused with 422 and `error.report` (the dry run) when any row has a problem; then nothing is written.',
        upload: { file: 'file' },
        response: importCommitted,
        status: 201,
      },
    ],
  ]),
);

export const CATALOGUE: Record<string, Operation> = {
  // Sign-in and the signed-in user
  'GET /api/health': { tag: 'System', summary: 'Whether the API reaches its database, queue and object store', response: obj({ status: z.enum(['ok', 'degraded']), checks: z.record(z.string(), z.unknown()) }) },
  'POST /api/auth/login': { tag: 'Sign-in', summary: 'Sign in with e-mail and password; sets the session cookie', body: loginRequest, response: sessionResponse },
  'POST /api/auth/logout': { tag: 'Sign-in', summary: 'Sign out (ends the session)', response: 'empty', status: 204 },
  'GET /api/auth/me': { tag: 'Sign-in', summary: 'The signed-in user', response: sessionResponse },
  'POST /api/auth/password': { tag: 'Sign-in', summary: 'Choose a new password (the current one is checked); ends your other sessions', body: changePasswordRequest, response: sessionResponse },
  'PATCH /api/me': { tag: 'Sign-in', summary: 'Your units (mm or in, °C or °F)', body: updatePreferencesRequest, response: sessionResponse },
  'GET /api/openapi.json': { tag: 'System', summary: 'This document (OpenAPI 3.1)', response: obj({ openapi: z.string() }) },
  'GET /metrics': {
    tag: 'System',
    summary: 'Prometheus metrics: request durations, queues, outbox, database pool',
    description: 'Outside /api. Answers requests from the machine itself, or with an admin API token.',
    response: 'prometheus',
  },

  // Users and API tokens
  'GET /api/users': { tag: 'Users', summary: 'Every user', response: obj({ users: z.array(userRecord) }) },
  'GET /api/users/customer-options': { tag: 'Users', summary: 'Customer companies a customer user can belong to', response: obj({ customers: z.array(customerOption) }) },
  'POST /api/users': { tag: 'Users', summary: 'Add a user', body: createUserRequest, response: obj({ user: userRecord }), status: 201 },
  'PATCH /api/users/:id': { tag: 'Users', summary: "Change a user's name, role, company, password or active flag", body: updateUserRequest, response: obj({ user: userRecord }) },
  'GET /api/tokens': { tag: 'API tokens', summary: 'Every API token (never the secrets)', response: tokenListResponse },
  'POST /api/tokens': { tag: 'API tokens', summary: 'Issue a token for one role; the secret is in this answer only', body: issueTokenRequest, response: issueTokenResponse, status: 201 },
  'POST /api/tokens/:id/revoke': { tag: 'API tokens', summary: 'Revoke a token: it stops working at once', response: obj({ token: apiTokenRecord }) },

  // Customers and orders
  'GET /api/customers': { tag: 'Customers', summary: 'Customer companies (search by name, contact or town)', query: listCustomersQuery, response: obj({ customers: z.array(customerSummary) }) },
  'GET /api/customers/:id': { tag: 'Customers', summary: 'One company with contacts, addresses and orders', response: obj({ customer: customerDetail }) },
  'POST /api/customers': { tag: 'Customers', summary: 'Add a company with its contacts', body: createCustomerRequest, response: obj({ customer: customerDetail }), status: 201 },
  'PATCH /api/customers/:id': { tag: 'Customers', summary: 'Change a company; `contacts` replaces the list', body: updateCustomerRequest, response: obj({ customer: customerDetail }) },
  'GET /api/orders': { tag: 'Orders', summary: 'Orders (filter by status, customer, due dates)', query: listOrdersQuery, response: orderListResponse },
  'GET /api/orders/:id': { tag: 'Orders', summary: 'One order with lines, attachments and history', response: obj({ order: orderDetail }) },
  'POST /api/orders': { tag: 'Orders', summary: 'Enter an order with its lines (requirements in SI)', body: createOrderRequest, response: obj({ order: orderDetail }), status: 201 },
  'PATCH /api/orders/:id': { tag: 'Orders', summary: 'Change an order; `lines` replaces the list while it is entered', body: updateOrderRequest, response: obj({ order: orderDetail }) },
  'POST /api/orders/:id/acknowledge': { tag: 'Orders', summary: 'Acknowledge an order (mails the customer through the outbox)', response: obj({ order: orderDetail, notification: z.record(z.string(), z.unknown()) }) },
  'POST /api/orders/:id/cancel': { tag: 'Orders', summary: 'Cancel an order, saying why', body: cancelOrderRequest, response: obj({ order: orderDetail }) },
  'POST /api/orders/:id/attachments': { tag: 'Orders', summary: 'Attach a drawing or spec (PDF, PNG, JPEG, DXF, STEP; up to 25 MB)', upload: { file: 'file', fields: obj({ lineId: z.string().optional() }) }, response: attachmentCreated, status: 201 },
  'GET /api/attachments/:id': { tag: 'Orders', summary: 'Download an attachment', response: 'binary' },
  'DELETE /api/attachments/:id': { tag: 'Orders', summary: 'Remove an attachment', response: 'empty', status: 204 },

  // Engineering
  'GET /api/engineering/queue': { tag: 'Engineering', summary: 'Order lines waiting for a build sheet, approval or release', response: engineeringQueueResponse },
  'GET /api/order-lines/:id': { tag: 'Engineering', summary: 'An order line with its build sheets', response: orderLineDetail },
  'POST /api/order-lines/:id/build-sheet': { tag: 'Engineering', summary: 'Draft a build sheet for a line (computed on the server)', body: draftBuildSheetRequest, response: buildSheetRecord, status: 201 },
  'GET /api/build-sheets/:id': { tag: 'Engineering', summary: 'One build sheet', response: buildSheetRecord },
  'GET /api/build-sheets/:id/stock-check': { tag: 'Engineering', summary: "What the line's work orders need of the sheet's wire against free stock", response: stockCheck },
  'POST /api/build-sheets/:id/approve': { tag: 'Engineering', summary: 'Approve a draft build sheet', body: approveBuildSheetRequest, response: buildSheetRecord },
  'POST /api/build-sheets/:id/release': { tag: 'Engineering', summary: 'Release an approved sheet as work orders (reserves wire, queues travelers)', body: releaseBuildSheetRequest, response: releaseResponse },
  'POST /api/coil/calculate': { tag: 'Coil engine', summary: 'Compute a coil from a spec (SI)', body: CoilSpecSchema, response: z.record(z.string(), z.unknown()) },
  'POST /api/coil/sweep': { tag: 'Coil engine', summary: 'The spec computed over the neighbouring wire sizes', body: CoilSpecSchema, response: z.record(z.string(), z.unknown()) },
  'POST /api/coil/profile': { tag: 'Coil engine', summary: 'Temperature and current against time for a spec', body: CoilSpecSchema, response: coilProfileResponse },
  'POST /api/coil/solve': { tag: 'Coil engine', summary: 'Find the wire and turns that meet a target', body: CoilSolveRequestSchema, response: z.record(z.string(), z.unknown()) },
  'GET /api/coil/reference': { tag: 'Coil engine', summary: 'Wire tables, thermal classes and constants the engine uses', response: coilReferenceResponse },
  'GET /api/spools': { tag: 'Wire stock', summary: 'Spools in stock with reserved and free mass (kg)', query: listSpoolsQuery, response: spoolListResponse },
  'POST /api/spools': { tag: 'Wire stock', summary: 'Receive a spool into stock', body: receiveSpoolRequest, response: obj({ spool: spoolRecord }), status: 201 },

  // Work orders and the floor
  'GET /api/work-orders': { tag: 'Work orders', summary: 'Work orders (filter by stage, order, assignee …)', query: listWorkOrdersQuery, response: workOrderListResponse },
  'GET /api/work-orders/:id': { tag: 'Work orders', summary: 'One work order with its build sheet and history', response: workOrderDetail },
  'PATCH /api/work-orders/:id': { tag: 'Floor', summary: 'Change priority, due date or station (names the version it read)', body: updateWorkOrderRequest, response: z.record(z.string(), z.unknown()) },
  'POST /api/work-orders/:id/move': { tag: 'Floor', summary: 'Move a work order to another stage (names the version it read)', body: moveWorkOrderRequest, response: z.record(z.string(), z.unknown()) },
  'POST /api/work-orders/assign': { tag: 'Floor', summary: 'Assign one or many work orders to a person and station', body: assignWorkOrdersRequest, response: obj({ workOrders: z.array(z.record(z.string(), z.unknown())) }) },
  'GET /api/stations': { tag: 'Floor', summary: 'Winding machines, benches, ovens and testers', query: listStationsQuery, response: obj({ stations: z.array(stationRecord) }) },
  'POST /api/stations': { tag: 'Floor', summary: 'Add a station', body: createStationRequest, response: obj({ station: stationRecord }), status: 201 },
  'PATCH /api/stations/:id': { tag: 'Floor', summary: 'Change or retire a station', body: updateStationRequest, response: obj({ station: stationRecord }) },
  'GET /api/board': { tag: 'Floor', summary: 'The board: every stage with its count and hours, the first cards of each column in the foreman’s order (ETag / 304)', query: boardQuery, response: boardResponse },
  'GET /api/board/columns/:stage': { tag: 'Floor', summary: 'The next page of one board column (cursor from nextCursor)', query: boardColumnQuery, response: boardColumn },
  'GET /api/floor/load': { tag: 'Floor', summary: 'Hours of work per station and person over the coming days', query: floorLoadQuery, response: floorLoad },
  'GET /api/floor/my-work': { tag: 'Floor', summary: 'The signed-in floor hand’s queue', response: myWorkResponse },
  'GET /api/floor/events': { tag: 'Floor', summary: 'Live changes to work orders (server-sent events)', response: 'event-stream' },
  'POST /api/work-orders/:id/traveler': { tag: 'Travelers', summary: 'Print (queue) the traveler PDF of a work order', response: travelerJobAccepted, status: 202 },
  'GET /api/work-orders/:id/traveler': { tag: 'Travelers', summary: 'Whether the traveler is printed and current', response: travelerInfo },
  'GET /api/work-orders/:id/traveler.pdf': { tag: 'Travelers', summary: 'The traveler PDF', response: 'pdf' },
  'POST /api/travelers/batch': { tag: 'Travelers', summary: 'Print the travelers of many work orders as one PDF (queued)', body: travelerBatchRequest, response: travelerJobAccepted, status: 202 },
  'GET /api/traveler-batches/:key.pdf': { tag: 'Travelers', summary: 'A printed batch of travelers', response: 'pdf' },

  // Tests and quality
  'GET /api/instruments': { tag: 'Quality', summary: 'Test instruments with calibration due dates', response: obj({ instruments: z.array(z.record(z.string(), z.unknown())) }) },
  'POST /api/instruments': { tag: 'Quality', summary: 'Add an instrument', body: createInstrumentRequest, response: obj({ instrument: z.record(z.string(), z.unknown()) }), status: 201 },
  'PATCH /api/instruments/:id': { tag: 'Quality', summary: 'Change an instrument (calibration date, retire)', body: updateInstrumentRequest, response: obj({ instrument: z.record(z.string(), z.unknown()) }) },
  'POST /api/work-orders/:id/serials': { tag: 'Quality', summary: 'The next serial numbers of a work order', body: serialsRequest, response: obj({ serials: z.array(z.string()) }), status: 201 },
  'POST /api/work-orders/:id/test-records': { tag: 'Quality', summary: 'Record a unit’s test; the server judges it against the build sheet', body: recordTestRequest, response: z.record(z.string(), z.unknown()), status: 201 },
  'GET /api/work-orders/:id/test-records': { tag: 'Quality', summary: 'A work order’s test records, nonconformances and yield', response: z.record(z.string(), z.unknown()) },
  'POST /api/nonconformances/:id/disposition': { tag: 'Quality', summary: 'Disposition a failed unit (rework, scrap, use as is)', body: dispositionRequest, response: z.record(z.string(), z.unknown()) },
  'POST /api/nonconformances/:id/approve': { tag: 'Quality', summary: 'An engineer approves a use-as-is', body: approveRequest, response: z.record(z.string(), z.unknown()) },
  'GET /api/quality/summary': { tag: 'Quality', summary: 'First-pass yield by week, coil kind and station; common failure reasons', response: z.record(z.string(), z.unknown()) },
  'GET /api/quality/design-feedback': { tag: 'Quality', summary: 'Measured heat-transfer coefficient against the design', response: z.record(z.string(), z.unknown()) },
  'POST /api/quality/design-feedback/adopt': { tag: 'Quality', summary: 'Adopt the measured heat-transfer coefficient for new build sheets', body: adoptHeatTransferRequest, response: z.record(z.string(), z.unknown()) },

  // Shipping and the customer's view
  'GET /api/shipping/ready': { tag: 'Shipping', summary: 'Work orders in packing by customer and order', response: z.record(z.string(), z.unknown()) },
  'POST /api/shipments': { tag: 'Shipping', summary: 'Record a shipment (moves its work orders to shipped, mails the customer)', body: createShipmentRequest, response: z.record(z.string(), z.unknown()), status: 201 },
  'GET /api/shipments': { tag: 'Shipping', summary: 'Shipments', query: listShipmentsQuery, response: obj({ shipments: z.array(z.record(z.string(), z.unknown())) }) },
  'GET /api/shipments/:id': { tag: 'Shipping', summary: 'One shipment with items, documents and the notice', response: z.record(z.string(), z.unknown()) },
  'GET /api/shipments/:id/documents/:kind': { tag: 'Shipping', summary: 'The packing list or certificate of conformance (PDF)', response: 'pdf' },
  'POST /api/shipments/:id/documents': { tag: 'Shipping', summary: 'Redraw a shipment’s documents (queued)', response: z.record(z.string(), z.unknown()), status: 202 },
  'GET /api/portal/orders': { tag: 'Customer portal', summary: 'The customer’s own orders and their progress', response: obj({ orders: z.array(z.record(z.string(), z.unknown())) }) },
  'GET /api/portal/orders/:id': { tag: 'Customer portal', summary: 'One of the customer’s orders', response: z.record(z.string(), z.unknown()) },
  'GET /api/portal/shipments': { tag: 'Customer portal', summary: 'The customer’s shipments', response: obj({ shipments: z.array(z.record(z.string(), z.unknown())) }) },
  'GET /api/portal/shipments/:id': { tag: 'Customer portal', summary: 'One of the customer’s shipments', response: z.record(z.string(), z.unknown()) },

  // Background work and settings
  'GET /api/jobs': { tag: 'Background work', summary: 'Failed background jobs', response: obj({ jobs: z.array(failedJob) }) },
  'GET /api/jobs/:id': { tag: 'Background work', summary: 'A job’s state and progress', response: jobStateResponse },
  'POST /api/jobs/:id/retry': { tag: 'Background work', summary: 'Retry a failed job', response: jobStateResponse },
  'GET /api/notifications': { tag: 'Background work', summary: 'The e-mail outbox', query: listOutboxQuery, response: outboxResponse },
  'POST /api/notifications/:id/retry': { tag: 'Background work', summary: 'Send an outbox row again', response: obj({ notification: notificationRecord }) },
  'GET /api/settings': { tag: 'Settings', summary: 'Shop settings', response: obj({ settings: shopSettings }) },
  'PATCH /api/settings': { tag: 'Settings', summary: 'Change shop settings', body: updateShopSettingsRequest, response: obj({ settings: shopSettings }) },

  ...IMPORT_OPS,
};

