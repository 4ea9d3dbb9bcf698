// Freezes shared test inputs, so a function that mutates its input throws (modules run in strict
// mode) instead of quietly changing the fixture for the next test (simple-statistics' habit).

/**
 * Object.freeze on `value` and, recursively, on every plain object, array and function-free value
 * it holds. Typed arrays are left alone (their elements cannot be frozen). Returns `value`.
 *
 * @example
 * const LEGS = deepFreeze({ relaxed: {} });
 * LEGS.relaxed.x = 1; // TypeError in strict mode
 */
export function deepFreeze<T>(value: T): T {
  if (value === null || typeof value !== 'object' || ArrayBuffer.isView(value) || Object.isFrozen(value)) return value;
  for (const key of Reflect.ownKeys(value)) deepFreeze((value as Record<PropertyKey, unknown>)[key]);
  return Object.freeze(value);
}
