// Small builders for the JSON Schema sources, so the schemas read like the format they describe.
// A schema built here is plain data: scripts/build-validators.ts writes it out as JSON and
// compiles it ahead of time; the app never compiles a schema at run time.

export type Schema = Record<string, unknown>;

export const ISO_UTC_PATTERN =
  '^[0-9]{4}-(0[1-9]|1[0-2])-(0[1-9]|[12][0-9]|3[01])T([01][0-9]|2[0-3]):[0-5][0-9]:[0-5][0-9](\\.[0-9]{1,3})?Z$';
export const ID_PATTERN = '^[A-Za-z0-9][A-Za-z0-9._:@-]*$';

export const isoUtc = (description: string): Schema => ({ type: 'string', maxLength: 24, pattern: ISO_UTC_PATTERN, description });
export const id = (description: string): Schema => ({ type: 'string', minLength: 1, maxLength: 128, pattern: ID_PATTERN, description });
export const text = (maxLength: number, description: string): Schema => ({ type: 'string', maxLength, description });
export const num = (minimum: number, maximum: number, description: string): Schema => ({ type: 'number', minimum, maximum, description });
export const int = (minimum: number, maximum: number, description: string): Schema => ({ type: 'integer', minimum, maximum, description });
export const oneOf = (values: readonly string[], description: string): Schema => ({ type: 'string', enum: [...values], description });
export function nullable(s: Schema): Schema {
  const out: Schema = { ...s, type: [s.type as string, 'null'] };
  if (Array.isArray(s.enum)) out.enum = [...(s.enum as unknown[]), null];
  return out;
}
export const constant = (value: string | number, description: string): Schema => ({ const: value, description });

/** A closed object: every listed property, `required` ones must be there, nothing else. */
export function object(description: string, properties: Record<string, Schema>, required: string[]): Schema {
  return { type: 'object', description, properties, required, additionalProperties: false };
}

export const array = (items: Schema, maxItems: number, description: string): Schema => ({ type: 'array', items, maxItems, description });
