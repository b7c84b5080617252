/** The API page's field tables: a JSON Schema (OpenAPI 3.1's dialect) flattened into rows. */
import { describe, expect, it } from 'vitest';
import type { JsonSchema } from '../../src/features/integrations/api';
import { schemaRows } from '../../src/features/integrations/schemaRows';

describe('schemaRows', () => {
  it('opens objects, lists and unions into dotted names with their rules', () => {
    // Written by hand in the shape JSON Schema 2020-12 gives such a body.
    const schema: JsonSchema = {
      type: 'object',
      required: ['name', 'lines'],
      properties: {
        name: { type: 'string', minLength: 1, maxLength: 60 },
        count: { type: 'integer', minimum: -9007199254740991, maximum: 9007199254740991 },
        lines: {
          type: 'array',
          items: {
            type: 'object',
            required: ['drive'],
            properties: {
              drive: {
                oneOf: [
                  { type: 'object', required: ['kind', 'volts'], properties: { kind: { type: 'string', const: 'voltage' }, volts: { type: 'number', exclusiveMinimum: 0 } } },
                  { type: 'object', required: ['kind', 'amps'], properties: { kind: { type: 'string', const: 'current' }, amps: { type: 'number', exclusiveMinimum: 0 } } },
                ],
              },
            },
          },
        },
      },
    };
    expect(schemaRows(schema).map((r) => [r.name, r.type, r.required, r.rules])).toEqual([
      ['name', 'string', true, 'not empty, at most 60 characters'],
      ['count', 'integer', false, ''],
      ['lines', 'list', true, ''],
      ['lines[].drive', 'object', true, ''],
      ['lines[].drive.kind', '"voltage"', true, ''],
      ['lines[].drive.volts', 'number', true, '> 0'],
      ['lines[].drive.kind', '"current"', true, ''],
      ['lines[].drive.amps', 'number', true, '> 0'],
    ]);
  });
});
