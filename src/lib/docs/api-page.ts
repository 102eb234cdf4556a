/**
 * What the API page (src/pages/docs/api.astro) shows, read from the OpenAPI document itself: operations
 * grouped by tag, and each parameter, body and answer as a flat list of fields. Pure: plain JSON in.
 */

/** The parts of an OpenAPI 3.1 document the page reads. */
export interface JsonSchema {
  $ref?: string;
  type?: string | string[];
  properties?: Record<string, JsonSchema>;
  required?: string[];
  items?: JsonSchema;
  prefixItems?: JsonSchema[];
  anyOf?: JsonSchema[];
  oneOf?: JsonSchema[];
  allOf?: JsonSchema[];
  enum?: unknown[];
  const?: unknown;
  minimum?: number;
  maximum?: number;
  exclusiveMinimum?: number;
  exclusiveMaximum?: number;
  minLength?: number;
  maxLength?: number;
  minItems?: number;
  maxItems?: number;
  default?: unknown;
  description?: string;
  format?: string;
  additionalProperties?: unknown;
}

interface MediaType {
  schema?: JsonSchema;
}
export interface OperationDoc {
  operationId: string;
  summary?: string;
  description?: string;
  tags?: string[];
  parameters?: { name: string; in: string; required?: boolean; description?: string; schema?: JsonSchema }[];
  requestBody?: { content: Record<string, MediaType> };
  /** Refusals refer to `components.responses` (`$ref`); the success answer is written out. */
  responses: Record<string, { description: string; content?: Record<string, MediaType>; $ref?: string }>;
  'x-token-scope'?: 'read' | 'write';
  'x-access'?: string;
}
export interface ApiDoc {
  info: { title: string; version: string; description?: string };
  tags?: { name: string; description?: string }[];
  paths: Record<string, Partial<Record<string, OperationDoc>>>;
  components?: { schemas?: Record<string, JsonSchema> };
}

export interface Field {
  name: string;
  type: string;
  required: boolean;
  notes: string;
  /** The shared shape the type names (`Target` for `Target[]`), described once further down the page. */
  ref?: string;
}

/** The shared shape a field's type is, or is a list or nullable of. */
export function namedOf(s: JsonSchema | undefined): string | undefined {
  if (!s) return undefined;
  return refName(s) ?? refName(s.allOf?.find((x) => x.$ref)) ?? namedOf(s.items) ?? (s.anyOf ?? s.oneOf ?? []).filter((a) => a.type !== 'null').map(namedOf).find((x) => x !== undefined && (s.anyOf ?? s.oneOf)!.length === 2);
}

export interface PageOperation extends OperationDoc {
  method: string;
  path: string;
}

const METHODS = ['get', 'post', 'put', 'patch', 'delete'] as const;

/** Operations grouped by tag, in the document's tag order. */
export function byTag(doc: ApiDoc): { name: string; description: string; operations: PageOperation[] }[] {
  const groups = (doc.tags ?? []).map((t) => ({ name: t.name, description: t.description ?? '', operations: [] as PageOperation[] }));
  for (const [path, item] of Object.entries(doc.paths)) {
    for (const method of METHODS) {
      const op = item[method];
      if (!op) continue;
      const tag = op.tags?.[0] ?? 'Other';
      let g = groups.find((x) => x.name === tag);
      if (!g) groups.push((g = { name: tag, description: '', operations: [] }));
      g.operations.push({ ...op, method, path });
    }
  }
  return groups.filter((g) => g.operations.length);
}

/** A schema with its `$ref` followed and an `allOf` (a reference plus local notes) merged. */
function resolve(doc: ApiDoc, s: JsonSchema | undefined, depth = 0): JsonSchema {
  let cur = s ?? {};
  for (let i = 0; cur.$ref && i < 10; i++) cur = { ...doc.components?.schemas?.[cur.$ref.replace('#/components/schemas/', '')], ...(cur.description ? { description: cur.description } : {}) };
  if (cur.allOf && depth < 5) {
    const { allOf, ...rest } = cur;
    cur = Object.assign({}, ...allOf.map((x) => resolve(doc, x, depth + 1)), rest);
  }
  return cur;
}

/** The component name a schema refers to (`Target`), if it is a reference. */
export const refName = (s: JsonSchema | undefined) => s?.$ref?.replace('#/components/schemas/', '');

/** A nullable `anyOf: [X, {type: 'null'}]` as X, with `nullable` noted. */
function unwrapNull(doc: ApiDoc, s: JsonSchema): { s: JsonSchema; nullable: boolean } {
  const r = resolve(doc, s);
  const alts = r.anyOf ?? r.oneOf;
  if (alts && alts.length === 2 && alts.some((a) => a.type === 'null')) {
    const other = alts.find((a) => a.type !== 'null')!;
    return { s: { ...resolve(doc, other), description: r.description ?? other.description }, nullable: true };
  }
  if (Array.isArray(r.type) && r.type.includes('null')) {
    const rest = r.type.filter((t) => t !== 'null');
    return { s: { ...r, type: rest.length === 1 ? rest[0] : rest }, nullable: true };
  }
  return { s: r, nullable: false };
}

export function typeOf(doc: ApiDoc, schema: JsonSchema | undefined): string {
  if (!schema) return 'any';
  const pair = schema.anyOf ?? schema.oneOf;
  if (pair && pair.length === 2 && pair.some((a) => a.type === 'null')) return `${typeOf(doc, pair.find((a) => a.type !== 'null'))} | null`;
  const name = refName(schema) ?? refName(schema.allOf?.find((x) => x.$ref));
  if (name) return name;
  const { s, nullable } = unwrapNull(doc, schema);
  let t: string;
  if (s.enum) t = s.enum.map((v) => JSON.stringify(v)).join(' | ');
  else if (s.const !== undefined) t = JSON.stringify(s.const);
  else if (s.prefixItems) t = `[${s.prefixItems.map((p) => typeOf(doc, p)).join(', ')}]`;
  else if (s.type === 'array') t = `${typeOf(doc, s.items)}[]`;
  else if (s.anyOf || s.oneOf) t = (s.anyOf ?? s.oneOf)!.map((x) => typeOf(doc, x)).join(' | ');
  else if (Array.isArray(s.type)) t = s.type.join(' | ');
  else t = s.type ?? (s.properties ? 'object' : 'any');
  return nullable ? `${t} | null` : t;
}

const num = (n: number) => (n < 0 ? `−${-n}` : String(n));

/** Description, range, length, format and default of a field, in words. */
export function notesOf(doc: ApiDoc, schema: JsonSchema | undefined): string {
  const { s: r } = unwrapNull(doc, schema ?? {});
  const s = { ...r, description: schema?.description ?? r.description };
  const out: string[] = [];
  if (s.description) out.push(s.description);
  const lo = s.minimum ?? s.exclusiveMinimum;
  const hi = s.maximum ?? s.exclusiveMaximum;
  if (lo !== undefined && hi !== undefined) out.push(`${num(lo)}${s.exclusiveMinimum !== undefined ? ' (excl.)' : ''} to ${num(hi)}${s.exclusiveMaximum !== undefined ? ' (excl.)' : ''}`);
  else if (lo !== undefined) out.push(`≥ ${num(lo)}`);
  else if (hi !== undefined) out.push(`≤ ${num(hi)}`);
  if (s.maxLength !== undefined) out.push(`at most ${s.maxLength} characters`);
  if (s.maxItems !== undefined) out.push(`at most ${s.maxItems} items`);
  if (s.format) out.push(s.format);
  if (s.default !== undefined) out.push(`default ${JSON.stringify(s.default)}`);
  return out.join('; ');
}

/**
 * The fields of a schema, nested objects flattened to dotted names (`site.lat`, `targets[].name`) down to
 * `depth` levels; a union of object shapes is listed once, as its alternatives' type.
 */
export function fieldsOf(doc: ApiDoc, schema: JsonSchema | undefined, depth = 2, prefix = '', max = 60): Field[] {
  const out: Field[] = [];
  const walk = (sch: JsonSchema | undefined, pre: string, level: number) => {
    const { s } = unwrapNull(doc, sch ?? {});
    const target = s.type === 'array' && s.items ? unwrapNull(doc, s.items).s : s;
    const props = target.properties;
    if (!props) return;
    const arr = s.type === 'array' ? '[]' : '';
    for (const [name, p] of Object.entries(props)) {
      if (out.length >= max) return;
      const full = pre ? `${pre}${arr}.${name}` : name;
      const ref = namedOf(p);
      out.push({ name: full, type: typeOf(doc, p), required: (target.required ?? []).includes(name), notes: notesOf(doc, p), ...(ref ? { ref } : {}) });
      if (level < depth && !ref) walk(p, full, level + 1);
    }
  };
  walk(schema, prefix, 1);
  return out;
}

/** The JSON (or other) schema of a body or answer, with its media type. */
export function contentOf(content: Record<string, MediaType> | undefined): { type: string; schema: JsonSchema | undefined } | null {
  if (!content) return null;
  const [type, media] = Object.entries(content)[0] ?? [];
  return type ? { type, schema: media?.schema } : null;
}

/** The shared shapes (`components.schemas`), each as its fields or, for a choice of shapes, each alternative's. */
export function sharedShapes(doc: ApiDoc): { name: string; alternatives: { title: string; fields: Field[] }[]; type: string }[] {
  return Object.entries(doc.components?.schemas ?? {}).map(([name, schema]) => {
    const alts = schema.oneOf ?? schema.anyOf;
    if (alts && !schema.properties) {
      return {
        name,
        type: typeOf(doc, schema),
        alternatives: alts.map((a, i) => {
          const r = resolve(doc, a);
          const kind = Object.entries(r.properties ?? {}).find(([, p]) => p.enum?.length === 1 || p.const !== undefined);
          const title = kind ? `${kind[0]}: ${JSON.stringify(kind[1].const ?? kind[1].enum![0])}` : `shape ${i + 1}`;
          return { title, fields: fieldsOf(doc, a, 1) };
        }),
      };
    }
    return { name, type: typeOf(doc, { ...schema }), alternatives: [{ title: '', fields: fieldsOf(doc, schema, 1) }] };
  });
}
