/**
 * Fuzzing every zod schema in lib/validation, found by import so a new schema is fuzzed without
 * being listed: arbitrary JSON (and objects carrying the schema's own field names with junk values)
 * never makes safeParse throw, and every refusal has a message and a path.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { z } from "zod";

const modules = import.meta.glob<Record<string, unknown>>(["./*.ts", "!./*.test.ts"], { eager: true });

const schemas = Object.entries(modules).flatMap(([file, exports]) =>
  Object.entries(exports)
    .filter((entry): entry is [string, z.ZodType] => entry[1] instanceof z.ZodType)
    .map(([name, schema]) => [`${file.replace("./", "")}#${name}`, schema] as const),
);

/** Field names the schema knows, found through object shapes (also inside pipes, defaults and optionals). */
function fieldNames(schema: z.ZodType, depth = 0): string[] {
  if (depth > 4) return [];
  const def = (schema as unknown as { def?: Record<string, unknown> }).def ?? {};
  const shape = (schema as unknown as { shape?: Record<string, unknown> }).shape;
  const names = shape && typeof shape === "object" ? Object.keys(shape) : [];
  for (const key of ["in", "out", "innerType", "schema"]) {
    const inner = def[key];
    if (inner instanceof z.ZodType) names.push(...fieldNames(inner, depth + 1));
  }
  return [...new Set(names)];
}

const junk = fc.oneof(
  fc.jsonValue({ maxDepth: 2 }),
  fc.constantFrom("", " ", "330k", "2.2 nF", "AWG 28", "1e999", "-0", "NaN", "2026-13-45T99:99", "count", "on", "true", "member", "admin", "\u0000"),
  fc.string({ maxLength: 12 }),
);

describe.each(schemas)("%s under fuzzing", (_name, schema) => {
  const fields = fieldNames(schema);
  const shaped = fields.length > 0 ? fc.dictionary(fc.constantFrom(...fields), junk, { maxKeys: fields.length }) : fc.constant({});

  it("never throws from safeParse; refusals carry a message and a path", () => {
    fc.assert(
      fc.property(fc.oneof(fc.jsonValue({ maxDepth: 3 }), shaped), (input) => {
        const result = schema.safeParse(input);
        if (result.success) return;
        expect(result.error.issues.length).toBeGreaterThan(0);
        for (const issue of result.error.issues) {
          expect(typeof issue.message).toBe("string");
          expect(issue.message.trim().length).toBeGreaterThan(0);
          expect(Array.isArray(issue.path)).toBe(true);
        }
      }),
      { numRuns: 150 },
    );
  });
});

it("finds the schemas it fuzzes", () => {
  expect(schemas.length).toBeGreaterThan(20);
});
