import type { JsonSchema } from './api';

/** One field of a request or answer, flattened for a table: "lines[].requirement.drive.volts". */
export type SchemaRow = { name: string; type: string; required: boolean; rules: string; description: string };

function typeWords(s: JsonSchema): string {
  if (s.const !== undefined) return JSON.stringify(s.const);
  if (s.enum) return s.enum.map((v) => JSON.stringify(v)).join(' | ');
  const alts = s.anyOf ?? s.oneOf;
  if (alts) return alts.map(typeWords).join(' | ');
  if (s.type === 'array') return `list of ${s.items ? typeWords(s.items) : 'values'}`;
  if (Array.isArray(s.type)) return s.type.join(' | ');
  return s.type ?? (s.properties ? 'object' : 'any');
}

function ruleWords(s: JsonSchema): string {
  const r: string[] = [];
  // Bounds that only restate the number type (JavaScript's safe integers) say nothing.
  const real = (v: number | undefined) => v !== undefined && Math.abs(v) < Number.MAX_SAFE_INTEGER;
  if (!real(s.minimum)) s = { ...s, minimum: undefined };
  if (!real(s.maximum)) s = { ...s, maximum: undefined };
  if (s.minimum !== undefined) r.push(`≥ ${s.minimum}`);
  if (s.exclusiveMinimum !== undefined) r.push(`> ${s.exclusiveMinimum}`);
  if (s.maximum !== undefined) r.push(`≤ ${s.maximum}`);
  if (s.exclusiveMaximum !== undefined) r.push(`< ${s.exclusiveMaximum}`);
  if (s.minLength === 1) r.push('not empty');
  else if (s.minLength !== undefined && s.minLength > 1) r.push(`at least ${s.minLength} characters`);
  if (s.maxLength !== undefined) r.push(`at most ${s.maxLength} characters`);
  if (s.format) r.push(s.format);
  if (s.pattern) r.push(`pattern ${s.pattern}`);
  if (s.default !== undefined) r.push(`default ${JSON.stringify(s.default)}`);
  return r.join(', ');
}

/**
 * The fields of a JSON Schema as rows, objects opened up to `depth` levels; the variants of a
 * union (a drive by voltage or by current) each add their own fields.
 */
export function schemaRows(schema: JsonSchema | undefined, depth = 4, prefix = '', required = true): SchemaRow[] {
  if (!schema) return [];
  const rows: SchemaRow[] = [];
  const alts = schema.anyOf ?? schema.oneOf ?? schema.allOf;
  if (alts && !schema.properties) {
    const seen = new Set<string>();
    for (const alt of alts) for (const r of schemaRows(alt, depth, prefix, required)) if (!seen.has(r.name + r.type)) (seen.add(r.name + r.type), rows.push(r));
    return rows;
  }
  if (schema.type === 'array' && schema.items && (schema.items.properties || schema.items.anyOf)) return schemaRows(schema.items, depth, `${prefix}[]`, required);
  if (!schema.properties || depth === 0) return prefix ? [{ name: prefix, type: typeWords(schema), required, rules: ruleWords(schema), description: schema.description ?? '' }] : [];
  for (const [name, sub] of Object.entries(schema.properties)) {
    const full = prefix ? `${prefix}.${name}` : name;
    const req = Boolean(schema.required?.includes(name));
    const opens = sub.properties || sub.anyOf || sub.oneOf || (sub.type === 'array' && (sub.items?.properties || sub.items?.anyOf));
    if (opens && depth > 1) {
      rows.push({ name: full, type: typeWords(sub).startsWith('list') ? 'list' : 'object', required: req, rules: '', description: sub.description ?? '' });
      rows.push(...schemaRows(sub, depth - 1, full, req));
    } else rows.push({ name: full, type: typeWords(sub), required: req, rules: ruleWords(sub), description: sub.description ?? '' });
  }
  return rows;
}
