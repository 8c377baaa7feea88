/**
 * A small JSON Schema (draft 2020-12) checker for the subset of keywords that
 * docs/scene.schema.json uses, so that the schema can be tested against the
 * reader without another dependency. Semantics follow the specification,
 * "JSON Schema Validation: A Vocabulary for Structural Validation of JSON",
 * draft 2020-12, sections 6.1-6.5, and "JSON Schema Core" 2020-12, section 10
 * (applicators). An unknown keyword is a test failure, so the subset cannot
 * grow silently beyond what is checked here.
 */

type Schema = boolean | { readonly [k: string]: unknown };

const ANNOTATIONS = new Set(['$schema', '$id', 'title', 'description', '$defs', '$comment', 'default', 'examples']);
const KNOWN = new Set([
  'type', 'properties', 'required', 'additionalProperties', 'enum', 'const', 'minimum', 'maximum',
  'exclusiveMinimum', 'exclusiveMaximum', 'minItems', 'maxItems', 'items', 'prefixItems', 'minLength',
  'maxLength', 'pattern', 'oneOf', 'anyOf', 'allOf', 'not', 'if', 'then', 'else', '$ref', 'dependentRequired',
  'uniqueItems',
]);

function isObject(v: unknown): v is Record<string, unknown> {
  return v !== null && typeof v === 'object' && !Array.isArray(v);
}

/** JSON has no NaN or Infinity: such a value is no JSON number (Validation 2020-12, 6.1.1 and RFC 8259 section 6). */
function jsonType(v: unknown): string {
  if (v === null) return 'null';
  if (Array.isArray(v)) return 'array';
  if (typeof v === 'number') return Number.isFinite(v) ? (Number.isInteger(v) ? 'integer' : 'number') : 'not-json';
  if (typeof v === 'object') return 'object';
  return typeof v;
}

function deepEqual(a: unknown, b: unknown): boolean {
  if (a === b) return true;
  if (Array.isArray(a) && Array.isArray(b)) return a.length === b.length && a.every((x, i) => deepEqual(x, b[i]));
  if (isObject(a) && isObject(b)) {
    const ka = Object.keys(a);
    return ka.length === Object.keys(b).length && ka.every((k) => Object.prototype.hasOwnProperty.call(b, k) && deepEqual(a[k], b[k]));
  }
  return false;
}

/** The first violation found, as "path: keyword", or null when the value is valid. */
export function schemaViolation(root: Schema, value: unknown): string | null {
  const resolve = (ref: string): Schema => {
    if (!ref.startsWith('#/')) throw new Error(`unsupported $ref ${ref}`);
    let node: unknown = root;
    for (const part of ref.slice(2).split('/')) node = (node as Record<string, unknown>)[part];
    if (node === undefined) throw new Error(`unresolved $ref ${ref}`);
    return node as Schema;
  };

  const check = (schema: Schema, v: unknown, path: string): string | null => {
    if (schema === true) return null;
    if (schema === false) return `${path}: false schema`;
    for (const k of Object.keys(schema)) {
      if (!KNOWN.has(k) && !ANNOTATIONS.has(k)) throw new Error(`keyword ${k} is outside the checked subset`);
    }
    const s = schema as Record<string, unknown>;
    const t = jsonType(v);
    if (s.$ref !== undefined) {
      const r = check(resolve(s.$ref as string), v, path);
      if (r) return r;
    }
    if (s.type !== undefined) {
      const types = Array.isArray(s.type) ? (s.type as string[]) : [s.type as string];
      const ok = types.some((ty) => ty === t || (ty === 'number' && t === 'integer'));
      if (!ok) return `${path}: type ${String(s.type)}`;
    }
    if (s.const !== undefined && !deepEqual(v, s.const)) return `${path}: const`;
    if (s.enum !== undefined && !(s.enum as unknown[]).some((e) => deepEqual(e, v))) return `${path}: enum`;
    if (t === 'number' || t === 'integer') {
      const x = v as number;
      if (typeof s.minimum === 'number' && x < s.minimum) return `${path}: minimum`;
      if (typeof s.maximum === 'number' && x > s.maximum) return `${path}: maximum`;
      if (typeof s.exclusiveMinimum === 'number' && x <= s.exclusiveMinimum) return `${path}: exclusiveMinimum`;
      if (typeof s.exclusiveMaximum === 'number' && x >= s.exclusiveMaximum) return `${path}: exclusiveMaximum`;
    }
    if (t === 'string') {
      const x = v as string;
      const length = [...x].length; // code points (Validation 2020-12, 6.3.1)
      if (typeof s.minLength === 'number' && length < s.minLength) return `${path}: minLength`;
      if (typeof s.maxLength === 'number' && length > s.maxLength) return `${path}: maxLength`;
      if (typeof s.pattern === 'string' && !new RegExp(s.pattern, 'u').test(x)) return `${path}: pattern`;
    }
    if (t === 'array') {
      const x = v as unknown[];
      if (typeof s.minItems === 'number' && x.length < s.minItems) return `${path}: minItems`;
      if (typeof s.maxItems === 'number' && x.length > s.maxItems) return `${path}: maxItems`;
      if (s.uniqueItems === true && x.some((a, i) => x.findIndex((b) => deepEqual(a, b)) !== i)) return `${path}: uniqueItems`;
      const prefix = (s.prefixItems as Schema[] | undefined) ?? [];
      for (let i = 0; i < x.length; i++) {
        const sub = i < prefix.length ? prefix[i] : (s.items as Schema | undefined);
        if (sub !== undefined) {
          const r = check(sub, x[i], `${path}[${i}]`);
          if (r) return r;
        }
      }
    }
    if (t === 'object') {
      const x = v as Record<string, unknown>;
      for (const k of (s.required as string[] | undefined) ?? []) {
        if (!Object.prototype.hasOwnProperty.call(x, k)) return `${path}: required ${k}`;
      }
      const props = (s.properties as Record<string, Schema> | undefined) ?? {};
      for (const k of Object.keys(x)) {
        if (Object.prototype.hasOwnProperty.call(props, k)) {
          const r = check(props[k], x[k], `${path}.${k}`);
          if (r) return r;
        } else if (s.additionalProperties !== undefined) {
          const r = check(s.additionalProperties as Schema, x[k], `${path}.${k}`);
          if (r) return `${r} (additionalProperties)`;
        }
      }
      const dep = (s.dependentRequired as Record<string, string[]> | undefined) ?? {};
      for (const [k, needs] of Object.entries(dep)) {
        if (Object.prototype.hasOwnProperty.call(x, k)) {
          for (const n of needs) if (!Object.prototype.hasOwnProperty.call(x, n)) return `${path}: dependentRequired ${k} -> ${n}`;
        }
      }
    }
    for (const sub of (s.allOf as Schema[] | undefined) ?? []) {
      const r = check(sub, v, path);
      if (r) return r;
    }
    if (s.anyOf !== undefined && !(s.anyOf as Schema[]).some((sub) => check(sub, v, path) === null)) return `${path}: anyOf`;
    if (s.oneOf !== undefined && (s.oneOf as Schema[]).filter((sub) => check(sub, v, path) === null).length !== 1) return `${path}: oneOf`;
    if (s.not !== undefined && check(s.not as Schema, v, path) === null) return `${path}: not`;
    if (s.if !== undefined) {
      const branch = check(s.if as Schema, v, path) === null ? s.then : s.else;
      if (branch !== undefined) {
        const r = check(branch as Schema, v, path);
        if (r) return r;
      }
    }
    return null;
  };
  return check(root, value, '');
}
