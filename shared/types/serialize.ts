/**
 * A value as it arrives through JSON: every `Date` becomes its ISO string, at
 * any depth; arrays and tuples keep their shape, optional and readonly fields
 * stay so. The server builds a reply with `Date`s (`Server…` types), the page
 * reads `Serialize<Server…>`.
 */
export type Serialize<T> = T extends Date
  ? string
  : T extends object
    ? { [K in keyof T]: Serialize<T[K]> }
    : T
