/**
 * The source a new standard starts from: a small, complete standard (a simply supported beam under a
 * uniform load, checked in bending) that compiles and verifies, so a lead edits something that works
 * instead of a blank page. Its one verification case is the closed form M = wL²/8.
 */
export function starterSource(title: string): string {
  const safeTitle = JSON.stringify(title);
  return `---
title: ${safeTitle}
category: beams
tags: [beam]
summary: Replace this summary — what the standard calculates, for which members.
scope: Prismatic member, first-order elastic analysis.
limitations:
  - Say here what this standard does not cover.
references:
  - ANSI/AISC 360-16, Chapter F
inputs:
  L:   { label: Span, quantity: length, unit: m, default: 6 m, min: 0.5 m, max: 30 m }
  w:   { label: Uniform load, quantity: force-per-length, unit: kN/m, default: 10 kN/m }
  E:   { label: Young's modulus, quantity: stress, unit: GPa, default: 200 GPa }
  I_x: { label: Second moment of area, symbol: "I_x", quantity: second-moment-of-area, unit: mm^4, default: 2.0e8 mm^4 }
  A_g: { label: Gross area, symbol: "A_g", quantity: area, unit: mm^2, default: 6000 mm^2 }
  Z_x: { label: Plastic modulus, symbol: "Z_x", quantity: section-modulus, unit: mm^3, default: 1.2e6 mm^3 }
  F_y: { label: Yield strength, symbol: "F_y", quantity: stress, unit: MPa, default: 345 MPa }
derived:
  phi_M_n: { label: Design bending strength, symbol: "\\\\phi_b M_n", expr: "0.9 * F_y * Z_x", quantity: moment, unit: kN m, digits: 3 }
model:
  nodes:
    - { id: A, x: 0 m, y: 0 m, support: pinned }
    - { id: B, x: L, y: 0 m, support: roller-x }
  members:
    - { id: beam, start: A, end: B, E: E, A: A_g, I: I_x, group: beams }
  load_cases:
    - id: W
      loads:
        - { member: beam, direction: global-y, w: -w }
  combinations:
    - { id: U, factors: { W: 1.6 } }
extracts:
  M_u: { label: Factored moment, max_abs: M, members: beams, under: U, unit: kN m }
checks:
  bending:
    label: Bending strength
    demand: M_u
    capacity: phi_M_n
    clause: AISC 360-16 Eq. F2-1
    fails: Choose a section with a larger Z_x.
    unit: kN m
verification:
  - name: Uniform load, closed form
    inputs: { w: 10 kN/m, L: 6 m }
    expect:
      M_u: { value: "1.6 * 10 kN/m * (6 m)^2 / 8", tolerance: 1e-9 }
    source: "AWC Design Aid No. 6 (2005), Fig. 1: M_max = wL²/8"
---

# ${title.replace(/[<>{}]/g, "")}

The member spans <Input name="L" /> under <Input name="w" />. Its design bending strength is

<Derivation of="phi_M_n" />

<Check name="bending" />
`;
}
