/**
 * The JSON model format of the frame engine: one zod schema, also exported as JSON Schema.
 *
 * Units are SI throughout (N, m, Pa, kg/m³); unit conversion belongs to the templates, not the engine.
 * Property checks that need a message a person can act on (E ≤ 0, missing I on a frame member, a load on a
 * member that does not exist…) are done in `validate.ts`, not here, so the schema only describes shape.
 *
 * Sign conventions (see lib/engine/README.md):
 * - Global axes: X to the right, Y up, rotation Z counter-clockwise positive.
 * - Local member axes: x from the start node to the end node, y = x rotated 90° counter-clockwise.
 */
import { z } from "zod";

const id = z.string().min(1);

/** How one global direction of a node is held. */
export const RestraintSchema = z.union([
  z.literal("free"),
  z.literal("fixed"),
  z
    .object({
      kind: z.literal("spring"),
      /** N/m for ux, uy; N·m/rad for rz. */
      stiffness: z.number(),
    })
    .strict(),
  z
    .object({
      kind: z.literal("prescribed"),
      /** Imposed displacement (m) or rotation (rad), e.g. a support settlement (negative uy = downwards). */
      value: z.number(),
      /** The load case in which the displacement is imposed; omitted = every load case. Elsewhere it acts as fixed. */
      loadCase: id.optional(),
    })
    .strict(),
]);
export type Restraint = z.infer<typeof RestraintSchema>;

export const SupportSchema = z
  .object({
    ux: RestraintSchema.default("free"),
    uy: RestraintSchema.default("free"),
    rz: RestraintSchema.default("free"),
  })
  .strict();
export type Support = z.infer<typeof SupportSchema>;

export const NodeSchema = z
  .object({
    id,
    x: z.number(),
    y: z.number(),
    support: SupportSchema.optional(),
  })
  .strict();
export type ModelNode = z.infer<typeof NodeSchema>;

export const MemberSchema = z
  .object({
    id,
    /** Node ids; local x runs from `start` to `end`. */
    start: id,
    end: id,
    /** A truss member carries axial force only at its ends (both end moments released). */
    kind: z.enum(["frame", "truss"]).default("frame"),
    /** Young's modulus, Pa. */
    E: z.number(),
    /** Area, m². */
    A: z.number(),
    /** Second moment of area about the bending axis, m⁴. Required for frame members. */
    I: z.number().optional(),
    /** Distance from the centroid to the extreme fibre on the +y (local) side, m; enables stresses. */
    cTop: z.number().optional(),
    /** Distance from the centroid to the extreme fibre on the −y (local) side, m. */
    cBottom: z.number().optional(),
    /** Mass density, kg/m³; used by the `self-weight` load. */
    density: z.number().optional(),
    /** Moment releases (hinges) at the member ends. */
    releases: z
      .object({ startMoment: z.boolean().default(false), endMoment: z.boolean().default(false) })
      .strict()
      .optional(),
  })
  .strict();
export type ModelMember = z.infer<typeof MemberSchema>;

/** Direction of a member load: along the local axes of the member or along the global axes. */
export const LoadDirectionSchema = z.enum(["local-x", "local-y", "global-x", "global-y"]);
export type LoadDirection = z.infer<typeof LoadDirectionSchema>;

export const NodalLoadSchema = z
  .object({
    kind: z.literal("nodal"),
    node: id,
    /** Global components: N, N, N·m (counter-clockwise positive). */
    fx: z.number().default(0),
    fy: z.number().default(0),
    mz: z.number().default(0),
  })
  .strict();

export const DistributedLoadSchema = z
  .object({
    kind: z.literal("distributed"),
    member: id,
    direction: LoadDirectionSchema,
    /** Intensity (N/m) at `from` and at `to`; `wEnd` omitted = uniform. Positive along the chosen axis. */
    wStart: z.number(),
    wEnd: z.number().optional(),
    /** Distances along the member from its start node, m; omitted = the whole length. */
    from: z.number().optional(),
    to: z.number().optional(),
    /**
     * Intensity given per unit of projected length (global-y loads per horizontal length, global-x loads per
     * vertical length), e.g. snow on a sloped rafter. Only with global directions.
     */
    projected: z.boolean().default(false),
  })
  .strict();

export const PointLoadSchema = z
  .object({
    kind: z.literal("point"),
    member: id,
    direction: LoadDirectionSchema,
    /** Distance from the start node, m. */
    position: z.number(),
    /** Force, N, positive along the chosen axis. */
    value: z.number(),
  })
  .strict();

export const CoupleLoadSchema = z
  .object({
    kind: z.literal("couple"),
    member: id,
    position: z.number(),
    /** N·m, counter-clockwise positive. */
    value: z.number(),
  })
  .strict();

export const SelfWeightLoadSchema = z
  .object({
    kind: z.literal("self-weight"),
    /** Multiplier on ρ·A·g acting in global −y. */
    factor: z.number().default(1),
  })
  .strict();

export const LoadSchema = z.discriminatedUnion("kind", [
  NodalLoadSchema,
  DistributedLoadSchema,
  PointLoadSchema,
  CoupleLoadSchema,
  SelfWeightLoadSchema,
]);
export type Load = z.infer<typeof LoadSchema>;
export type LoadInput = z.input<typeof LoadSchema>;
export type NodalLoad = z.infer<typeof NodalLoadSchema>;
export type DistributedLoad = z.infer<typeof DistributedLoadSchema>;
export type PointLoad = z.infer<typeof PointLoadSchema>;
export type CoupleLoad = z.infer<typeof CoupleLoadSchema>;

export const LoadCaseSchema = z.object({ id, name: z.string().optional(), loads: z.array(LoadSchema).default([]) }).strict();
export type LoadCase = z.infer<typeof LoadCaseSchema>;

/** A named factor table: result = Σ factor · (load case result). */
export const CombinationSchema = z
  .object({ id, name: z.string().optional(), factors: z.record(z.string(), z.number()) })
  .strict();
export type Combination = z.infer<typeof CombinationSchema>;

/** Max and min of every result over a set of load cases and/or combinations (by id). */
export const EnvelopeSchema = z.object({ id, name: z.string().optional(), of: z.array(id).min(1) }).strict();
export type Envelope = z.infer<typeof EnvelopeSchema>;

/** Linear today; the discriminant leaves room for second-order (P-Delta) analysis. */
export const AnalysisOptionsSchema = z.discriminatedUnion("kind", [z.object({ kind: z.literal("linear") }).strict()]);
export type AnalysisOptions = z.infer<typeof AnalysisOptionsSchema>;

export const ModelSchema = z
  .object({
    schemaVersion: z.literal(1).default(1),
    /** Plane frames today; the field leaves room for 3D. */
    dimension: z.literal("2d").default("2d"),
    analysis: AnalysisOptionsSchema.default({ kind: "linear" }),
    nodes: z.array(NodeSchema),
    members: z.array(MemberSchema).default([]),
    loadCases: z.array(LoadCaseSchema).default([]),
    combinations: z.array(CombinationSchema).default([]),
    envelopes: z.array(EnvelopeSchema).default([]),
  })
  .strict();

/** A model after parsing (defaults applied). */
export type Model = z.infer<typeof ModelSchema>;
/** A model as written by a person or a template (defaults may be omitted). */
export type ModelInput = z.input<typeof ModelSchema>;

/** The model format as JSON Schema (draft 2020-12), for documentation and other languages. */
export function modelJsonSchema(): Record<string, unknown> {
  return z.toJSONSchema(ModelSchema, { io: "input" }) as Record<string, unknown>;
}
