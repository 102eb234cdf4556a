/**
 * The schema a client should send, seen through the wrappers our validation adds. `knownKeysOnly` and
 * `boundedArray` check the raw value first (`z.unknown().superRefine(…).pipe(shape)`), and the generator
 * describes a pipe by its input side, which would document every body as "anything". This returns a copy
 * of the schema in which such a pipe is replaced by its output side; everything else is kept as it is
 * (the routes keep validating with the original). Pure (zod only).
 */
import { z, type ZodTypeAny } from 'zod';

/** Children a zod 3 definition can hold, by key. */
const CHILD_KEYS = ['innerType', 'schema', 'type', 'in', 'out', 'left', 'right', 'keyType', 'valueType', 'rest'] as const;

type AnyDef = Record<string, unknown> & { typeName?: string };
const defOf = (s: ZodTypeAny) => s._def as AnyDef;
const isZod = (v: unknown): v is ZodTypeAny => v instanceof z.ZodType;

/** Strips refinements and transforms to the schema underneath. */
function underEffects(s: ZodTypeAny): ZodTypeAny {
  let cur = s;
  while (defOf(cur).typeName === 'ZodEffects') cur = defOf(cur).schema as ZodTypeAny;
  return cur;
}

/** A pipe that only pre-checks the raw value (unknown → checks → shape). */
function isGuardPipe(s: ZodTypeAny): boolean {
  if (defOf(s).typeName !== 'ZodPipeline') return false;
  const first = defOf(underEffects(defOf(s).in as ZodTypeAny)).typeName;
  return first === 'ZodUnknown' || first === 'ZodAny';
}

/**
 * `memo` maps original schemas to their documented form; seed it with registered (named) schemas and
 * every place that uses one refers to the component instead of repeating it.
 */
export function docSchema<T extends ZodTypeAny>(schema: T, memo = new Map<ZodTypeAny, ZodTypeAny>()): ZodTypeAny {
  return view(schema, memo);
}

function view(s: ZodTypeAny, memo: Map<ZodTypeAny, ZodTypeAny>): ZodTypeAny {
  const seen = memo.get(s);
  if (seen) return seen;
  if (isGuardPipe(s)) {
    const out = view(defOf(s).out as ZodTypeAny, memo);
    memo.set(s, out);
    return out;
  }
  const def = defOf(s);
  const next: AnyDef = { ...def };
  let changed = false;
  for (const k of CHILD_KEYS) {
    const child = def[k];
    if (isZod(child)) {
      const v = view(child, memo);
      if (v !== child) {
        next[k] = v;
        changed = true;
      }
    }
  }
  if (def.typeName === 'ZodObject') {
    const shape = (s as z.AnyZodObject).shape as Record<string, ZodTypeAny>;
    const mapped = Object.fromEntries(Object.entries(shape).map(([k, v]) => [k, view(v, memo)]));
    if (Object.keys(shape).some((k) => mapped[k] !== shape[k])) {
      next.shape = () => mapped;
      changed = true;
    }
  }
  if (Array.isArray(def.items) || Array.isArray(def.options)) {
    const key = Array.isArray(def.items) ? 'items' : 'options';
    const list = def[key] as ZodTypeAny[];
    const mapped = list.map((o) => view(o, memo));
    if (mapped.some((o, i) => o !== list[i])) {
      if (def.typeName === 'ZodDiscriminatedUnion') {
        const du = z.discriminatedUnion(def.discriminator as string, mapped as [z.AnyZodObject, ...z.AnyZodObject[]]);
        memo.set(s, du);
        return du;
      }
      next[key] = mapped;
      changed = true;
    }
  }
  const out = changed ? (new (s.constructor as new (d: AnyDef) => ZodTypeAny)(next)) : s;
  memo.set(s, out);
  return out;
}
