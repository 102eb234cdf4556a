/**
 * The pure pieces behind the API description: the documented view of a validating schema
 * (src/lib/server/openapi/doc-schema.ts) and the page's reading of a document (src/lib/docs/api-page.ts).
 * Check values are the schemas' own declared limits and JSON Schema 2020-12 (OpenAPI 3.1's dialect).
 */
import { describe, expect, test } from 'vitest';
import { z } from 'zod';
import { docSchema } from '../../../src/lib/server/openapi/doc-schema';
import { knownKeysOnly } from '../../../src/lib/contracts/known-keys';
import { boundedArray } from '../../../src/lib/bounded-array';
import { linkCreateSchema } from '../../../src/lib/contracts/link';
import { fieldsOf, typeOf, type ApiDoc } from '../../../src/lib/docs/api-page';

describe('docSchema', () => {
  const shape = z.object({ name: z.string().max(10), tags: boundedArray(z.string(), 3).optional() });
  const guarded = knownKeysOnly(shape, shape);

  test('replaces the raw-value guard pipes by the shape they guard, at any depth', () => {
    const view = docSchema(guarded) as z.AnyZodObject;
    expect(view._def.typeName).toBe('ZodObject');
    expect(Object.keys(view.shape)).toEqual(['name', 'tags']);
    const tags = view.shape.tags as z.ZodOptional<z.ZodArray<z.ZodString>>;
    expect(tags.unwrap()._def.typeName).toBe('ZodArray');
  });

  test('leaves the validating schema as it was: unknown keys and long lists are still refused', () => {
    docSchema(guarded);
    expect(guarded.safeParse({ name: 'a', extra: 1 }).success).toBe(false);
    expect(guarded.safeParse({ name: 'a', tags: ['a', 'b', 'c', 'd'] }).success).toBe(false);
    expect(guarded.safeParse({ name: 'a', tags: ['a'] }).success).toBe(true);
  });

  test('a route body (share link) is documented by its fields', () => {
    const view = docSchema(linkCreateSchema) as z.AnyZodObject;
    expect(Object.keys(view.shape)).toEqual(['role', 'expiresAt']);
  });

  test('a schema without guards is returned as it is', () => {
    const plain = z.object({ a: z.number() });
    expect(docSchema(plain)).toBe(plain);
  });
});

describe('the API page reads the document', () => {
  const doc: ApiDoc = {
    info: { title: 't', version: '1' },
    paths: {},
    components: {
      schemas: {
        Site: { type: 'object', properties: { lat: { type: 'number', minimum: -90, maximum: 90 } }, required: ['lat'] },
      },
    },
  };

  test('types: a nullable reference, a list of references, a tuple, an enum', () => {
    expect(typeOf(doc, { anyOf: [{ $ref: '#/components/schemas/Site' }, { type: 'null' }] })).toBe('Site | null');
    expect(typeOf(doc, { type: 'array', items: { $ref: '#/components/schemas/Site' } })).toBe('Site[]');
    expect(typeOf(doc, { type: 'array', prefixItems: [{ type: 'number' }, { type: 'number' }] })).toBe('[number, number]');
    expect(typeOf(doc, { type: 'string', enum: ['viewer', 'reviewer'] })).toBe('"viewer" | "reviewer"');
  });

  test('fields: nested objects flattened, references named and not expanded, ranges in words', () => {
    const fields = fieldsOf(doc, {
      type: 'object',
      required: ['site'],
      properties: {
        site: { $ref: '#/components/schemas/Site' },
        camera: { type: 'object', properties: { fovDeg: { type: 'number', minimum: 5, maximum: 150, default: 90 } } },
      },
    });
    expect(fields).toEqual([
      { name: 'site', type: 'Site', required: true, notes: '', ref: 'Site' },
      { name: 'camera', type: 'object', required: false, notes: '' },
      { name: 'camera.fovDeg', type: 'number', required: false, notes: '5 to 150; default 90' },
    ]);
    // A reference at the top is followed: the fields of Site itself.
    expect(fieldsOf(doc, { $ref: '#/components/schemas/Site' })).toEqual([{ name: 'lat', type: 'number', required: true, notes: '−90 to 90' }]);
  });
});
