// The library kinds the database and the forms know (lib/domain, which may import nothing of ours) are the
// document's (lib/libraries): a kind added to one and not the other fails here.
import { describe, expect, it } from "vitest";
import { LIBRARY_KIND_IDS } from "@/lib/domain/schemas/libraries";
import { LIBRARY_KINDS } from "@/lib/libraries";

describe("library kinds", () => {
  it("are the same list in lib/domain and lib/libraries", () => {
    expect([...LIBRARY_KIND_IDS]).toEqual([...LIBRARY_KINDS]);
  });
});
