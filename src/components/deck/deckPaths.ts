/**
 * Reading and writing one field of a deck draft by its schema path (the same paths zod
 * reports issues on, e.g. ['girders', 'offsets', 2] or ['section', 'area']).
 */
export type FieldPath = readonly (string | number)[];

/** 'girders.offsets.2' — the key under which a field's messages are kept. */
export function pathKey(path: FieldPath): string {
  return path.join('.');
}

export function getAt(root: unknown, path: FieldPath): unknown {
  let node: unknown = root;
  for (const part of path) {
    if (node === null || typeof node !== 'object') return undefined;
    node = (node as Record<string | number, unknown>)[part];
  }
  return node;
}

/**
 * Sets a field, creating intermediate objects as needed. `undefined` removes an object's key
 * (an optional field left empty), so the draft never carries keys the schema would refuse.
 */
export function setAt(root: object, path: FieldPath, value: unknown): void {
  if (path.length === 0) throw new Error('setAt needs a non-empty path');
  let node = root as Record<string | number, unknown>;
  for (let i = 0; i < path.length - 1; i++) {
    const part = path[i];
    let next = node[part];
    if (next === null || typeof next !== 'object') {
      next = typeof path[i + 1] === 'number' ? [] : {};
      node[part] = next;
    }
    node = next as Record<string | number, unknown>;
  }
  const last = path[path.length - 1];
  if (value === undefined && !Array.isArray(node)) delete node[last];
  else node[last] = value;
}
