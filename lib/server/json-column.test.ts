// JSON columns come back from MariaDB as text: the JSON type is an alias of LONGTEXT with a JSON_VALID check
// (MariaDB Knowledge Base, "JSON Data Type"); the text is JSON as RFC 8259 defines it.
import { describe, expect, it } from "vitest";
import { jsonColumn, jsonColumnOrNull } from "./json-column";

describe("JSON columns", () => {
  it("parses the text the driver returns (RFC 8259 values: object, array, number, string, literals)", () => {
    expect(jsonColumn('{"a":[1,2.5,"x"],"b":null}')).toEqual({ a: [1, 2.5, "x"], b: null });
    expect(jsonColumn("[]")).toEqual([]);
    expect(jsonColumn("-0.5e2")).toBe(-50);
    expect(jsonColumn('"\\u00e9"')).toBe("é");
    expect(jsonColumn("false")).toBe(false);
    expect(jsonColumn("null")).toBeNull();
  });

  it("passes an already parsed value through and reads SQL NULL as null", () => {
    const v = { layers: [{ index: 0 }] };
    expect(jsonColumn(v)).toBe(v);
    expect(jsonColumn(null)).toBeNull();
    expect(jsonColumn(undefined)).toBeNull();
  });

  it("refuses text that is not JSON; the lenient reader gives null instead", () => {
    expect(() => jsonColumn("{not json")).toThrow(SyntaxError);
    expect(() => jsonColumn("")).toThrow(SyntaxError);
    expect(jsonColumnOrNull("{not json")).toBeNull();
    expect(jsonColumnOrNull("[1]")).toEqual([1]);
  });
});
