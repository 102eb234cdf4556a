/** Field-by-field comparison of two scene documents (pure): the conflict dialog's "compare". */
import { EDITABLE_FIELDS, type EditableField } from '../contracts/scene';

/** JSON with sorted object keys, so two equal documents always print the same. */
export function stableStringify(v: unknown, indent?: number): string {
  const norm = (x: unknown): unknown => {
    if (Array.isArray(x)) return x.map(norm);
    if (x && typeof x === 'object') {
      const o = x as Record<string, unknown>;
      return Object.fromEntries(
        Object.keys(o)
          .filter((k) => o[k] !== undefined)
          .sort()
          .map((k) => [k, norm(o[k])]),
      );
    }
    return x;
  };
  return JSON.stringify(norm(v) ?? null, null, indent) ?? 'null';
}

export const sameValue = (a: unknown, b: unknown) => stableStringify(a) === stableStringify(b);

export interface FieldDiff {
  field: EditableField;
  mine: unknown;
  theirs: unknown;
}

export function diffScenes(mine: Partial<Record<EditableField, unknown>>, theirs: Partial<Record<EditableField, unknown>>, fields: readonly EditableField[] = EDITABLE_FIELDS): FieldDiff[] {
  return fields.filter((f) => !sameValue(mine[f], theirs[f])).map((field) => ({ field, mine: mine[field], theirs: theirs[field] }));
}

/** Line diff of two pretty-printed values: which lines appear only on one side (LCS, fine for small documents). */
export function lineDiff(a: string, b: string): { left: { text: string; changed: boolean }[]; right: { text: string; changed: boolean }[] } {
  const A = a.split('\n');
  const B = b.split('\n');
  // Bound the table: beyond a few thousand lines, mark everything changed rather than allocate n·m cells.
  if (A.length * B.length > 4_000_000) {
    return { left: A.map((text) => ({ text, changed: true })), right: B.map((text) => ({ text, changed: true })) };
  }
  const m = A.length;
  const n = B.length;
  const L = Array.from({ length: m + 1 }, () => new Uint32Array(n + 1));
  for (let i = m - 1; i >= 0; i--) for (let j = n - 1; j >= 0; j--) L[i]![j] = A[i] === B[j] ? L[i + 1]![j + 1]! + 1 : Math.max(L[i + 1]![j]!, L[i]![j + 1]!);
  const keepA = new Set<number>();
  const keepB = new Set<number>();
  for (let i = 0, j = 0; i < m && j < n; ) {
    if (A[i] === B[j]) {
      keepA.add(i++);
      keepB.add(j++);
    } else if (L[i + 1]![j]! >= L[i]![j + 1]!) i++;
    else j++;
  }
  return {
    left: A.map((text, i) => ({ text, changed: !keepA.has(i) })),
    right: B.map((text, j) => ({ text, changed: !keepB.has(j) })),
  };
}

export const FIELD_LABELS: Record<EditableField, string> = {
  title: 'Title',
  description: 'Description',
  site: 'Site',
  time: 'Time',
  layers: 'Layers',
  camera: 'Camera',
  envelopeId: 'Team envelope',
  envelope: 'Envelope',
  targets: 'Targets',
  pins: 'Pins',
  steps: 'Steps',
};
