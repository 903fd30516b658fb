// Request parameters as the SDK sends them: form-encoded bodies and query strings in
// bracket notation (`metadata[zip]=…`, `expand[0]=…`), every leaf a string.
import { invalidParam, missingParam } from './errors';

export type ParamValue = string | ParamValue[] | ParamObject;
export interface ParamObject {
  [key: string]: ParamValue;
}

function splitKey(key: string): string[] {
  const open = key.indexOf('[');
  if (open <= 0 || !key.endsWith(']')) return [key];
  const parts = [key.slice(0, open)];
  const rest = key.slice(open);
  const re = /\[([^\[\]]*)\]/g;
  let consumed = 0;
  let m: RegExpExecArray | null;
  while ((m = re.exec(rest)) !== null) {
    if (m.index !== consumed) return [key];
    parts.push(m[1]);
    consumed = m.index + m[0].length;
  }
  return consumed === rest.length ? parts : [key];
}

type Node = { [key: string]: Node | string };

function arrayify(node: Node | string): ParamValue {
  if (typeof node === 'string') return node;
  const keys = Object.keys(node);
  if (keys.length > 0 && keys.every((k) => /^\d+$/.test(k))) {
    return keys
      .map(Number)
      .sort((a, b) => a - b)
      .map((k) => arrayify(node[String(k)]));
  }
  const out: ParamObject = {};
  for (const k of keys) out[k] = arrayify(node[k]);
  return out;
}

export function parseParams(search: URLSearchParams): ParamObject {
  // A null prototype keeps keys such as "__proto__" harmless.
  const root: Node = Object.create(null);
  for (const [key, value] of search) {
    const parts = splitKey(key);
    let node: Node = root;
    for (let i = 0; i < parts.length; i++) {
      let part = parts[i];
      if (part === '') part = String(Object.keys(node).length); // `list[]=` appends
      if (i === parts.length - 1) {
        node[part] = value;
      } else {
        const next = node[part];
        if (typeof next === 'object') {
          node = next;
        } else {
          const child: Node = Object.create(null);
          node[part] = child;
          node = child;
        }
      }
    }
  }
  return arrayify(root) as ParamObject;
}

export function parseFormBody(text: string): ParamObject {
  return parseParams(new URLSearchParams(text));
}

/** JSON bodies (handy with curl) are turned into the same all-strings shape. */
export function normalizeJson(value: unknown): ParamValue {
  if (value === null || value === undefined) return '';
  if (Array.isArray(value)) return value.map(normalizeJson);
  if (typeof value === 'object') {
    const out: ParamObject = {};
    for (const [k, v] of Object.entries(value as Record<string, unknown>)) out[k] = normalizeJson(v);
    return out;
  }
  return String(value);
}

const MAX_AMOUNT = 99_999_999;

/** Typed readers that raise the API's 400 errors naming the offending `param`. */
export class Params {
  constructor(readonly raw: ParamObject) {}

  private lookup(name: string): ParamValue | undefined {
    let node: ParamValue | undefined = this.raw;
    for (const part of splitKey(name)) {
      if (node === undefined || typeof node !== 'object' || Array.isArray(node)) return undefined;
      node = (node as ParamObject)[part];
    }
    return node;
  }

  has(name: string): boolean {
    return this.lookup(name) !== undefined;
  }

  /** A string; an empty string means "not given" (the SDK sends null as ""). */
  string(name: string, opts: { required?: boolean; maxLength?: number } = {}): string | undefined {
    const v = this.lookup(name);
    if (v === undefined || v === '') {
      if (opts.required) throw missingParam(name);
      return undefined;
    }
    if (typeof v !== 'string') throw invalidParam(name, `Invalid string: ${name} must be a string.`);
    if (opts.maxLength !== undefined && v.length > opts.maxLength) {
      throw invalidParam(name, `Invalid string: ${name} must be at most ${opts.maxLength} characters long.`);
    }
    return v;
  }

  integer(name: string, opts: { required?: boolean; min?: number } = {}): number | undefined {
    const s = this.string(name, { required: opts.required });
    if (s === undefined) return undefined;
    if (!/^-?\d+$/.test(s)) {
      throw invalidParam(name, `Invalid integer: ${s}`, 'parameter_invalid_integer');
    }
    const n = Number(s);
    if (opts.min !== undefined && n < opts.min) {
      throw invalidParam(name, `Invalid ${name}: must be at least ${opts.min}.`, 'parameter_invalid_integer');
    }
    return n;
  }

  /** An amount in the currency's smallest unit. */
  amount(name: string, opts: { required?: boolean; min?: number } = {}): number | undefined {
    const n = this.integer(name, { required: opts.required });
    if (n === undefined) return undefined;
    const min = opts.min ?? 1;
    if (n < min) {
      throw invalidParam(name, `The ${name} must be at least ${min} in the currency's smallest unit.`, 'amount_too_small');
    }
    if (n > MAX_AMOUNT) {
      throw invalidParam(name, `The ${name} must be no more than ${MAX_AMOUNT}.`, 'amount_too_large');
    }
    return n;
  }

  boolean(name: string): boolean | undefined {
    const s = this.string(name);
    if (s === undefined) return undefined;
    if (s === 'true') return true;
    if (s === 'false') return false;
    throw invalidParam(name, `Invalid boolean: ${s}`);
  }

  oneOf<T extends string>(name: string, values: readonly T[], opts: { required?: boolean } = {}): T | undefined {
    const s = this.string(name, opts);
    if (s === undefined) return undefined;
    if (!(values as readonly string[]).includes(s)) {
      throw invalidParam(name, `Invalid ${name}: must be one of ${values.join(', ')}.`);
    }
    return s as T;
  }

  currency(name = 'currency', opts: { required?: boolean } = { required: true }): string | undefined {
    const s = this.string(name, opts);
    if (s === undefined) return undefined;
    if (!/^[a-zA-Z]{3}$/.test(s)) throw invalidParam(name, `Invalid currency: ${s}.`);
    return s.toLowerCase();
  }

  email(name: string): string | undefined {
    const s = this.string(name, { maxLength: 512 });
    if (s !== undefined && !/^[^\s@]+@[^\s@]+$/.test(s)) {
      throw invalidParam(name, `Invalid email address: ${s}`, 'email_invalid');
    }
    return s;
  }

  object(name: string): ParamObject | undefined {
    const v = this.lookup(name);
    if (v === undefined || v === '') return undefined;
    if (typeof v !== 'object' || Array.isArray(v)) throw invalidParam(name, `Invalid object: ${name} must be a hash.`);
    return v;
  }

  /** A list of strings (`expand[0]=…`). */
  stringList(name: string): string[] {
    const v = this.lookup(name);
    if (v === undefined || v === '') return [];
    const items = Array.isArray(v) ? v : typeof v === 'string' ? [v] : Object.values(v);
    return items.map((item, i) => {
      if (typeof item !== 'string') throw invalidParam(`${name}[${i}]`, `Invalid string in ${name}.`);
      return item;
    });
  }

  /**
   * Metadata: up to 50 keys, keys up to 40 characters, values up to 500. An empty value
   * removes the key when updating, so it is returned as null for the caller to apply.
   */
  metadata(name = 'metadata'): Record<string, string | null> | undefined {
    const v = this.lookup(name);
    if (v === undefined) return undefined;
    if (v === '') return {};
    if (typeof v !== 'object' || Array.isArray(v)) throw invalidParam(name, 'Invalid metadata: must be a hash of strings.');
    const entries = Object.entries(v);
    if (entries.length > 50) throw invalidParam(name, 'Metadata can have at most 50 keys.');
    const out: Record<string, string | null> = {};
    for (const [key, value] of entries) {
      const param = `${name}[${key}]`;
      if (typeof value !== 'string') throw invalidParam(param, 'Metadata values must be strings.');
      if (key.length > 40) throw invalidParam(param, 'Metadata keys can be at most 40 characters long.');
      if (value.length > 500) throw invalidParam(param, 'Metadata values can be at most 500 characters long.');
      out[key] = value === '' ? null : value;
    }
    return out;
  }
}

/** Applies a metadata update (null removes a key) and returns the new map. */
export function mergeMetadata(
  current: Record<string, string>,
  update: Record<string, string | null> | undefined,
): Record<string, string> {
  if (update === undefined) return current;
  const next: Record<string, string> = { ...current };
  for (const [k, v] of Object.entries(update)) {
    if (v === null) delete next[k];
    else next[k] = v;
  }
  return next;
}
