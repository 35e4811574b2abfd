/**
 * Arrays as one bound parameter in Postgres's array text form, so an array never turns into a
 * parameter list and its items never enter the SQL text.
 */

/** An int[] parameter (each item checked to be a 32-bit integer). */
export function intArrayParam(items: readonly number[]): string {
  for (const x of items)
    if (!Number.isInteger(x) || x < -2147483648 || x > 2147483647)
      throw new Error(`not a 32-bit integer: ${x}`);
  return `{${items.join(",")}}`;
}

/** A text[] (or uuid[]) parameter, each item quoted and escaped. */
export function textArrayParam(items: readonly string[]): string {
  return `{${items.map((s) => `"${s.replace(/\\/g, "\\\\").replace(/"/g, '\\"')}"`).join(",")}}`;
}
