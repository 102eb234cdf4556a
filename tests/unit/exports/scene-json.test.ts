import { readFileSync } from 'node:fs';
import Ajv from 'ajv';
import { describe, expect, it } from 'vitest';
import { attachment, sceneFileSchema, slug, toSceneFile } from '../../../src/lib/exports/scene-json';
import { e1Scene } from './fixtures';

const schema = JSON.parse(readFileSync(new URL('../../../public/schemas/armilla-scene-1.schema.json', import.meta.url), 'utf8'));

describe('armilla-scene format version 1', () => {
  const file = toSceneFile(
    e1Scene({
      envelope: { name: '0.6 m', minAltitude: 20, horizonMask: [[0, 5], [180, 10]] },
      pins: [{ id: 'p1', kind: 'label', frame: 'horizontal', points: [[180, 30]], label: 'South' }],
      steps: [{ id: 'st1', title: 'Start', time: '2024-01-15T22:00:00Z', caption: '**Look** south', layers: {} }],
    }),
    new Date('2024-01-15T12:00:00Z'),
  );
  // "format" keywords are annotations here (draft-07 allows validators to skip them).
  const ajv = new Ajv({ allErrors: true, strict: false, validateFormats: false });
  const validate = ajv.compile(schema);
  it('an export validates against the committed JSON Schema and the server schema', () => {
    const doc = JSON.parse(JSON.stringify(file));
    expect(validate(doc), JSON.stringify(validate.errors)).toBe(true);
    expect(sceneFileSchema.safeParse(doc).success).toBe(true);
    expect(doc.format).toBe('armilla-scene');
    expect(doc.formatVersion).toBe(1);
  });
  it('both refuse another format version, a missing scene field and an out-of-range latitude', () => {
    const bad = (f: (d: any) => void) => {
      const d = JSON.parse(JSON.stringify(file));
      f(d);
      return d;
    };
    for (const d of [bad((d) => (d.formatVersion = 2)), bad((d) => delete d.scene.site), bad((d) => (d.scene.site.lat = 91))]) {
      expect(validate(d)).toBe(false);
      expect(sceneFileSchema.safeParse(d).success).toBe(false);
    }
  });
  it('file names are safe', () => {
    expect(slug('Équinoxe: evening, 2026!')).toBe('equinoxe-evening-2026');
    expect(attachment('a "b".json')).toBe(`attachment; filename="a _b_.json"; filename*=UTF-8''a%20%22b%22.json`);
  });
});
