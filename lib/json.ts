/**
 * The type a server value has once it crossed the wire as JSON
 * (`NextResponse.json` → `res.json()`): Dates arrive as ISO strings. Client
 * fetchers type their answers as `Jsonified<ReturnType<typeof builder>>`, so a
 * change in what the server builds shows up in the client's type check.
 */
export type Jsonified<T> = T extends Date
  ? string
  : T extends readonly (infer U)[]
    ? Jsonified<U>[]
    : T extends object
      ? { [K in keyof T]: Jsonified<T[K]> }
      : T;
