/**
 * The TypeScript type of a JSON schema written `as const`: the HTTP contract is written once, as the schemas of
 * shared/http-schemas.ts, and its types are derived here (no separate interfaces to drift from them).
 *
 * The subset of JSON Schema (draft 7, json-schema.org "Understanding JSON Schema") the routes use:
 * - `const` → that literal; `enum` → the union of its members;
 * - `anyOf` / `oneOf` → the union of the branches' types;
 * - `type` (one name or a list: `['number', 'null']` → number | null): string, number and integer (number), boolean,
 *   null, array (of `items`), object (of `properties`; the names in `required` are required, the others optional);
 * - an object without `properties` → Record<string, unknown>; anything else → unknown.
 * Validation keywords (minimum, maxItems, pattern …) narrow no type. `additionalProperties: true` lets a response
 * carry more than it describes (the contract may grow); the type lists the described fields only, and
 * test/server/http-contract.test.ts fails when a real response carries a field its schema does not describe.
 * Pure type-level code: nothing here exists at run time.
 */

/** A JSON schema's type, `FromSchema<typeof SCHEMA>`. */
export type FromSchema<S> = S extends { readonly const: infer C }
  ? C
  : S extends { readonly enum: readonly (infer E)[] }
    ? E
    : S extends { readonly anyOf: readonly (infer A)[] }
      ? Branches<A>
      : S extends { readonly oneOf: readonly (infer O)[] }
        ? Branches<O>
        : S extends { readonly type: readonly (infer T)[] }
          ? OfType<S, T>
          : S extends { readonly type: infer T }
            ? OfType<S, T>
            : unknown;

/** Each branch of an anyOf / oneOf on its own (distributes over the union of branches). */
type Branches<B> = B extends unknown ? FromSchema<B> : never;

/** The type of one `type` name (distributes over a union of names). */
type OfType<S, T> = T extends 'string'
  ? string
  : T extends 'number' | 'integer'
    ? number
    : T extends 'boolean'
      ? boolean
      : T extends 'null'
        ? null
        : T extends 'array'
          ? ArrayOf<S>
          : T extends 'object'
            ? ObjectOf<S>
            : never;

type ArrayOf<S> = S extends { readonly items: infer I } ? FromSchema<I>[] : unknown[];

type RequiredNames<S> = S extends { readonly required: readonly (infer K)[] } ? K : never;

/** Flattens an intersection into one object type (for readable hovers and error messages). */
type Flat<T> = { [K in keyof T]: T[K] } & {};

type ObjectOf<S> = S extends { readonly properties: infer P }
  ? Flat<
      { -readonly [K in keyof P as K extends RequiredNames<S> ? K : never]: FromSchema<P[K]> } & {
        -readonly [K in keyof P as K extends RequiredNames<S> ? never : K]?: FromSchema<P[K]>;
      }
    >
  : Record<string, unknown>;
