import { z, type ZodType } from 'zod';
import { apiErrorBody, CSRF_HEADER, CSRF_VALUE } from '../../src/contracts/errors';
import { ROLE_LABELS } from '../../src/contracts/roles';
import type { RouteInfo } from '../http/routes';
import { CATALOGUE, type Operation } from './catalogue';

type Json = Record<string, unknown>;

/** A contract schema as JSON Schema 2020-12 (the dialect OpenAPI 3.1 uses): requests as they are sent, answers as they come. */
function schemaOf(s: ZodType, io: 'input' | 'output'): Json {
  const j = z.toJSONSchema(s, { target: 'draft-2020-12', io, unrepresentable: 'any' }) as Json;
  delete j.$schema;
  return j;
}

const MEDIA: Record<string, [string, Json]> = {
  pdf: ['application/pdf', { type: 'string', contentMediaType: 'application/pdf' }],
  csv: ['text/csv', { type: 'string' }],
  'event-stream': ['text/event-stream', { type: 'string' }],
  prometheus: ['text/plain', { type: 'string', description: 'Prometheus text exposition format 0.0.4' }],
  binary: ['application/octet-stream', { type: 'string', contentMediaType: 'application/octet-stream' }],
};

const errorRef = (description: string) => ({ description, content: { 'application/json': { schema: { $ref: '#/components/schemas/Error' } } } });

/** "/api/orders/:id" → "/api/orders/{id}" and its path parameters. */
function openApiPath(expressPath: string) {
  const params: string[] = [];
  const path = expressPath.replace(/:(\w+)/g, (_, name: string) => {
    params.push(name);
    return `{${name}}`;
  });
  return { path, params };
}

/** Query parameters from an object schema: one per property. */
function queryParameters(s: ZodType): Json[] {
  const j = schemaOf(s, 'input') as { properties?: Record<string, Json>; required?: string[] };
  return Object.entries(j.properties ?? {}).map(([name, schema]) => ({ name, in: 'query', required: Boolean(j.required?.includes(name)), schema }));
}

function operation(key: string, op: Operation, route: RouteInfo | undefined): Json {
  const [method, expressPath] = key.split(' ');
  const { params } = openApiPath(expressPath);
  const rule = route?.rule;
  const isPublic = !rule || 'public' in rule;
  const roles = rule && 'roles' in rule ? [...rule.roles] : [];
  const who = isPublic ? 'Anyone.' : `Roles: ${roles.map((r) => ROLE_LABELS[r]).join(', ')}.${rule && 'loopback' in rule ? ' Also any request from the machine itself.' : ''}`;
  const parameters: Json[] = params.map((name) => ({ name, in: 'path', required: true, schema: name === 'id' ? { type: 'integer', minimum: 1 } : { type: 'string' } }));
  if (op.query) parameters.push(...queryParameters(op.query));
  const changes = !['GET', 'HEAD'].includes(method);
  if (changes && expressPath.startsWith('/api/')) {
    parameters.push({
      name: CSRF_HEADER,
      in: 'header',
      required: false,
      description: `Required as "${CSRF_VALUE}" with a session cookie; not needed with an API token.`,
      schema: { type: 'string', const: CSRF_VALUE },
    });
  }

  const status = String(op.status ?? 200);
  const responses: Json = {};
  if (op.response === 'empty') responses[status] = { description: 'Done' };
  else if (typeof op.response === 'string') responses[status] = { description: 'The file or stream', content: { [MEDIA[op.response][0]]: { schema: MEDIA[op.response][1] } } };
  else responses[status] = { description: 'Success', content: { 'application/json': { schema: op.response ? schemaOf(op.response, 'output') : { type: 'object' } } } };
  if (op.body || op.query || op.upload) responses['400'] = errorRef('A field is not valid (`error.fields` names it)');
  if (!isPublic) {
    responses['401'] = errorRef('Not signed in, or the API token is unknown or revoked');
    responses['403'] = errorRef('This role may not do this (or the password must be changed first)');
  }
  if (params.length) responses['404'] = errorRef('No such record');
  if (changes) responses['409'] = errorRef('Changed by someone else meanwhile, or it exists already');
  if (changes) responses['422'] = errorRef('A business rule refuses it (the message says which)');

  const out: Json = {
    tags: [op.tag],
    summary: op.summary,
    description: [op.description, who].filter(Boolean).join('\n\n'),
    operationId: `${method.toLowerCase()}${expressPath.replace(/[^A-Za-z0-9]+(\w)?/g, (_, c?: string) => (c ? c.toUpperCase() : ''))}`,
    'x-roles': roles,
    security: isPublic ? [] : [{ session: [] }, { token: [] }],
    responses,
  };
  if (parameters.length) out.parameters = parameters;
  if (op.body) out.requestBody = { required: true, content: { 'application/json': { schema: schemaOf(op.body, 'input') } } };
  if (op.upload) {
    const fields = op.upload.fields ? (schemaOf(op.upload.fields, 'input') as { properties?: Json }).properties : {};
    out.requestBody = {
      required: true,
      content: {
        'multipart/form-data': {
          schema: { type: 'object', required: [op.upload.file], properties: { [op.upload.file]: { type: 'string', contentMediaType: 'application/octet-stream' }, ...fields } },
        },
      },
    };
  }
  return out;
}

/**
 * The OpenAPI 3.1 document of every route in the catalogue, with the roles each route's own
 * access rule admits (from the running app's routes).
 */
export function buildOpenApi(routes: RouteInfo[], opts: { version: string; serverUrl: string }): Json {
  const byKey = new Map(routes.map((r) => [`${r.method} ${r.path}`, r]));
  const paths: Record<string, Json> = {};
  for (const [key, op] of Object.entries(CATALOGUE)) {
    const [method, expressPath] = key.split(' ');
    const { path } = openApiPath(expressPath);
    paths[path] ??= {};
    paths[path][method.toLowerCase()] = operation(key, op, byKey.get(key));
  }
  const tags = [...new Set(Object.values(CATALOGUE).map((o) => o.tag))].map((name) => ({ name }));
  return {
    openapi: '3.1.0',
    info: {
      title: 'Spoolwright API',
      version: opts.version,
      description:
        'The job-tracking and work-order API of a coil winding shop. Quantities are SI (metres, kilograms, amperes, ohms, °C). ' +
        'Call it with the session cookie of a signed-in user (state-changing requests then carry the header ' +
        `${CSRF_HEADER}: ${CSRF_VALUE}), or with an API token an admin issued: \`Authorization: Bearer swt_…\`, which acts in the token's role. ` +
        'Every error has the body `{ error: { code, message, fields? } }`.',
    },
    servers: [{ url: opts.serverUrl }],
    tags,
    paths,
    components: {
      schemas: { Error: schemaOf(apiErrorBody, 'output') },
      securitySchemes: {
        session: { type: 'apiKey', in: 'cookie', name: 'spoolwright.sid', description: 'The session cookie set by POST /api/auth/login' },
        token: { type: 'http', scheme: 'bearer', description: 'An API token issued by an admin (POST /api/tokens)' },
      },
    },
  };
}
