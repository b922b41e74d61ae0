/**
 * Every starting library entry — the seed's "Firm sections" (the demo catalogue, imported from its CSV) and each
 * document under content/libraries — hashes as it did before the section builder's rules were numbered (rules 2
 * added the shear centre, Cw and the channels' and angles' fillet-corrected J). A stored run records its entry's
 * hash, so these may never change: a new convention is a new rule, which an entry names.
 * The hashes were taken from the builder as it stood before rules 2, by the same check and hashing the seed uses.
 */
import { describe, expect, it } from "vitest";
import {
  checkLibraryDocument,
  demoSectionsDocument,
  importCatalogue,
  libraryContentHash,
  libraryEntryHash,
} from "@/lib/libraries";
import { bindEntry } from "@/lib/libraries/bind";
import { startingLibraries } from "@/scripts/lib/starting-libraries";

const PINNED: Record<string, { content: string; entries: Record<string, string> }> = {
  "firm-sections": {
    content: "28bd2c301e3673b924bfd2163a074debb736a992d20d33a4c0c9f6641448ad4f",
    entries: {
      "GI 160x90x7.5": "926024cece0ce166d9f5882d9427bf1c7a070c8aae7e3d4ba5aca174513377af",
      "GI 200x100x8": "dfa87e293d94ddecd15973f350a32577171f16f299ac4d41268d172b441ef147",
      "GI 250x125x9": "a8fa5f10d6a2b8f7644f7f8c236c9573587b27ca8634b0dcc94ef3b464238373",
      "GI 300x150x10.5": "16f8779a5b59ebf633126401468cb5ede67bf2a127a143aac2409df894980491",
      "GI 350x170x12": "bd72cc0686a31ce7a78d081e14767947d2c93a67ce6163112e57eb8b6569cf3e",
      "GI 400x180x13.5": "17fe4c1a28cfdcf08084532a538113e79e44215b34a9b3b81a516602504cc313",
      "GI 450x190x14.5": "3618ac7c66c2ecce47d5224617f7728f36c40a95c1715a4914ccc05accaf13f0",
      "GI 500x200x16": "e90929e94ae98dc1b6f6c3a706300fc3a8a96aaa4cd7f971ef6ba1cd665a5582",
      "GI 600x220x19": "d3904ebeb665474c06447db5b468b5d58f260b38ed1aedc0e7ac374dbda45a5e",
      "GI 200x200x14": "d2313ff0f8503f72d206a7eafed5c4b00fd4764d4a3d8b9ad46b864f19bd7016",
      "GI 250x250x16": "4f9927cc655fbce2be90243556294c367acf1663029cde0ab54c4f17ec778da4",
      "GI 300x300x18": "475fc3c69c73544b99df839611221fd2564af96a9be01a671f6466b88691ee94",
      "GC 150x75x10": "c96a61b0e1d69c9d725156fb8a7ad07022efdf81c88f8cc671821ee627ef992d",
      "GC 200x80x11": "2e561dd9235c2d510347d691e307bc75e6ad6ff71b320de8c8ce7dfa59a70694",
      "GC 250x90x13": "4736a519af941d7c68b0e5bc6bfd76cac132675fa9767438465c5fe07c8b63ad",
      "GC 300x100x15": "93fb6ee2b9388921421340500f130d5cd8edf413a1fca79c592f4922609a63f2",
      "GR 100x100x5": "3c4913ba9c28077f25f743d6d4909e3f13f709d5fd1705ba69e362b351578c9b",
      "GR 150x100x6": "92ece5b6a7420785fd69b71566b99e05db3d486e871c6c4c11701eab03fd7251",
      "GR 200x200x8": "9bfd5cc76c578963e271ab5157cd6d3e7fb694350ef59418a4cc2688cdc893b9",
      "GR 250x150x10": "b483beba43f73160874a01ad71471dbbb6550b33de8b63d998b37f1252a35542",
      "GT 114x5": "0ef998204cebe01247aa7d20dc1b41995effe50345363fd10f36143626fd5719",
      "GT 168x6": "22ac8dbf01d525baf2e5bba7c5a94d01cee1f6c4cffe1b459afb2475580afd1c",
      "GT 273x8": "4f8bd1d823b73d7b9e11201b6352e33231d3f870e027b2a78807595b2e592694",
      "GL 60x60x6": "17de7df707af123045464fbc8fdca114c82eb4c21f84fda2f5ce255fbb0cae8f",
      "GL 100x100x10": "34c7178b2988c287ee6d18130301c527cdc64bbc3fe66961b3d748dd08df8f03",
      "GL 100x75x8": "4f6cc0463d8922a77da3a9a58785763d8dffbfdebf1d4267957aff20efea6144",
      "GL 150x90x10": "adc8f995c331e089fd428591dd0cddf85954c5342a4414135f750104b7efe129",
    },
  },
  "load-combinations": {
    content: "2330db1f9988a7b2f0ad7181a4bd6b838ce9b3247d00ebd18b99c1defbd11734",
    entries: {
      "ASCE/SEI 7-16 strength design (§2.3.1)": "b4e730139df995980f2585410a7703d9be2580410780f29c3209610ff0399655",
      "ASCE/SEI 7-16 allowable stress design (§2.4.1)": "aa70ca5bfcb21055cb23490d93b136b884791c69bc42cabc4a244ab99bdf402b",
      "EN 1990 STR by 6.10: A/B imposed, snow ≤ 1000 m, wind": "a3f883b7f0604f636da079ee842add6c29bb78a0462330aaeec2787dbe7bfb16",
      "EN 1990 STR by 6.10a/6.10b: A/B imposed, snow ≤ 1000 m, wind":
        "66be52535be5c606129434f6fb1aa91477580fd9870db1210dcea7934f03a450",
    },
  },
  materials: {
    content: "e725b59a57ee7a783347cd9e2544b7cca4ccbc618c08deaa9dea1fb686b1d03b",
    entries: {
      "ASTM A992": "1490b22ebdf8d5aeb5e80818caacdfdb1cd087b41a3de2755e52c8708944fe51",
      "S275 (EN 10025-2), t ≤ 40 mm": "7a420a57f6ff2e59025415787600e3060e378604f8b7aa78e8b4937d06a3df2a",
      "S355 (EN 10025-2), t ≤ 40 mm": "926885d65c55892e8356a8f51285024a4ba15755cc17a5023ee74edcbc5392dc",
      "S355 (EN 10025-2), 40 mm < t ≤ 80 mm": "786791980fa445469f44dc2af21e7c133214e1976e12fe2c476a568b242dee45",
      C24: "5d0f4a4a73ad31dcb63e6a00d8f80cc29ea7dd6437c7c2710ef301913bb16134",
      "C30/37": "f6c600068371257e826eb3cf61407ce3f6539b3133e8d3c92b8d26d0afd8cb48",
      "EN AW-6082 T6, extruded profile, 5 mm < t ≤ 15 mm": "111dd34cbf185cf51359a074a755c53ad50b8ccba929b362544e79ec8aff879e",
    },
  },
};

const documents = () => [
  { name: "firm-sections", raw: demoSectionsDocument() as unknown },
  ...startingLibraries().map((library) => ({ name: library.name, raw: library.document as unknown })),
];

describe("starting library entries keep their hashes", () => {
  it.each(documents().map((d) => [d.name, d.raw] as const))("%s: the content hash and every entry's hash", async (name, raw) => {
    const checked = checkLibraryDocument(raw);
    if (!checked.ok) throw new Error(JSON.stringify(checked.problems));
    const pinned = PINNED[name];
    const hashes: Record<string, string> = {};
    for (const entry of checked.document.entries) hashes[entry.key] = await libraryEntryHash(entry);
    expect(hashes).toEqual(pinned.entries);
    expect(await libraryContentHash(checked.document)).toBe(pinned.content);
  });

  it("covers the seed's sections and both content documents", () => {
    expect(documents().map((d) => d.name)).toEqual(Object.keys(PINNED));
  });

  it("an entry that names no rules is built by rules 1 (no Cw), one that names rules 2 by rules 2", () => {
    const entry = {
      key: "C",
      origin: { from: "builder" },
      shape: "channel",
      dimensions: { b: 0.09, d: 0.3, tf: 0.0155, tw: 0.009, r: 0.012 },
    };
    const old = checkLibraryDocument({ kind: "sections", title: "Old rules", entries: [entry] });
    const later = checkLibraryDocument({ kind: "sections", title: "New rules", entries: [{ ...entry, rules: 2 }] });
    if (!old.ok || !later.ok) throw new Error("not accepted");
    const [a, b] = [old.document.entries[0], later.document.entries[0]] as unknown as { computed: Record<string, number> }[];
    expect(a.computed).not.toHaveProperty("Cw");
    expect(Object.keys(b.computed).slice(0, Object.keys(a.computed).length)).toEqual(Object.keys(a.computed));
    expect(Object.keys(b.computed).slice(Object.keys(a.computed).length)).toEqual(["e0", "x0", "y0", "Cw"]);
    expect(b.computed.J).not.toBe(a.computed.J); // fillet-corrected under rules 2
    const refused = checkLibraryDocument({ kind: "sections", title: "No such rules", entries: [{ ...entry, rules: 3 }] });
    expect(refused.ok).toBe(false);
    expect(refused.ok ? [] : refused.problems.map((p) => [p.path, p.message])).toEqual([
      ["entries.0.rules", "The section builder's rules are 1 or 2."],
    ]);
  });

  it("a rules 2 entry gives runs its shear centre as lengths; Cw (m⁶, no quantity of the standards' yet) stays in the entry only", async () => {
    const entry = {
      key: "C",
      origin: { from: "builder" },
      shape: "channel",
      rules: 2,
      dimensions: { b: 0.09, d: 0.3, tf: 0.0155, tw: 0.009, r: 0.012 },
    };
    const checked = checkLibraryDocument({ kind: "sections", title: "New rules", entries: [entry] });
    if (!checked.ok) throw new Error(JSON.stringify(checked.problems));
    const bound = await bindEntry(checked.document, "C");
    expect(bound?.values.e0).toEqual({
      si: (checked.document.entries[0] as { computed: { e0: number } }).computed.e0,
      quantity: "length",
    });
    expect(bound?.values.x0?.quantity).toBe("length");
    expect(bound?.values).not.toHaveProperty("Cw");
  });

  it("a catalogue may list Cw: compared with the builder's under rules 2, and kept in the entry with its rules", () => {
    // UB 305×165×40: Iw = 0.164 dm⁶ (SCI P363, from memory), as section-torsion.test.ts checks it.
    const csv = "Designation,Shape,b,d,tf,tw,r,Cw\r\nUB 305x165x40,i,165,303.4,10.2,6,8.9,164000\r\n";
    const mm = (column: string) => ({ column, unit: "mm" });
    const mapping = {
      designation: "Designation",
      shape: { column: "Shape" },
      dimensions: { b: mm("b"), d: mm("d"), tf: mm("tf"), tw: mm("tw"), r: mm("r") },
      properties: { Cw: { column: "Cw", unit: "cm⁶" } }, // 0.164 dm⁶ = 164 000 cm⁶
    };
    const imported = importCatalogue(csv, mapping);
    expect(imported.problems).toEqual([]);
    expect(imported.differences).toEqual([]);
    expect(imported.rows[0].listed.Cw).toBeCloseTo(0.164e-6, 15);
    expect(imported.rows[0].section.rules).toBe(2);
    // Read by rules 1, the builder has no Cw to compare it with: the row is refused, naming the property.
    expect(importCatalogue(csv, mapping, { rules: 1 }).problems.map((p) => p.message)).toEqual([
      "Row 2 (UB 305x165x40): an I section has no Cw; leave the cell empty.",
    ]);
  });
});
