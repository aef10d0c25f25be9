// DEVELOPERS.md documents the permission matrix; this keeps the document and the code in step.
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { MATRIX, type Action } from "@/lib/auth/permissions";
import { ROLES } from "@/db/types";

const doc = readFileSync(new URL("../../DEVELOPERS.md", import.meta.url), "utf8");
const table = doc.split("<!-- permission-matrix:start -->")[1]!.split("<!-- permission-matrix:end -->")[0]!;
const rows = table
  .trim()
  .split("\n")
  .slice(2)
  .map((line) => line.split("|").map((c) => c.trim()).filter(Boolean));

describe("DEVELOPERS.md permission matrix", () => {
  it("lists every action of the code, once", () => {
    expect(rows.map((r) => r[0]).sort()).toEqual(Object.keys(MATRIX).sort());
  });

  it("has the role columns in the order of ROLES", () => {
    const header = table.trim().split("\n")[0]!.split("|").map((c) => c.trim()).filter(Boolean);
    expect(header).toEqual(["action", ...ROLES]);
  });

  it.each(rows.map((r) => [r[0]!, r.slice(1)] as const))("%s matches the code", (action, cells) => {
    const expected = ROLES.map((role) => ({ company: "all", own: "own", none: "-" })[MATRIX[action as Action][role]]);
    expect(cells).toEqual(expected);
  });
});
