/**
 * A value worked out once per object and kept on the object itself, under a private symbol that is not
 * enumerable: JSON, spreads, Object.keys and deep equality never see it. A match reads such values for
 * tens of thousands of parts, several times each; a property read is cheaper than a WeakMap lookup, and a
 * WeakMap of that size also slows every garbage collection. Objects that cannot take a property (frozen,
 * sealed) fall back to a WeakMap. `compute` never returns undefined, and the object must not change in a
 * way that would change the value.
 */
export function memoOnObject<O extends object, V extends NonNullable<unknown>>(compute: (o: O) => V): (o: O) => V {
  const key = Symbol('memo');
  const fallback = new WeakMap<O, V>();
  return (o: O): V => {
    const kept = (o as Record<symbol, V | undefined>)[key];
    if (kept !== undefined) return kept;
    const known = fallback.get(o);
    if (known !== undefined) return known;
    const value = compute(o);
    if (Object.isExtensible(o)) Object.defineProperty(o, key, { value, enumerable: false, writable: false, configurable: false });
    else fallback.set(o, value);
    return value;
  };
}
