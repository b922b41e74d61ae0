/**
 * Errors and warnings as data. The engine never prints and never throws for a bad model: every problem a
 * person can fix comes back as one of these, with a message that says what to change.
 */
import type { DofName } from "./dofs";

export type EngineError =
  | { kind: "invalid-model"; path: string; message: string }
  | { kind: "non-finite"; path: string; message: string }
  | { kind: "duplicate-id"; entity: "node" | "member" | "load-case" | "combination" | "envelope"; id: string; message: string }
  | { kind: "unknown-node"; path: string; node: string; message: string }
  | { kind: "unknown-member"; path: string; member: string; message: string }
  | { kind: "unknown-load-case"; path: string; loadCase: string; message: string }
  | { kind: "unknown-result"; path: string; id: string; message: string }
  | { kind: "zero-length-member"; member: string; message: string }
  | { kind: "missing-property"; member: string; property: string; message: string }
  | { kind: "non-positive-property"; path: string; property: string; value: number; message: string }
  | { kind: "load-outside-member"; path: string; member: string; message: string }
  | { kind: "invalid-load"; path: string; message: string }
  | { kind: "unstable"; node: string; direction: DofName; message: string }
  /** The supports let the whole structure move (rigid-body.ts); `unstable` is for one part moving. */
  | ({ kind: "rigid-body"; message: string } & RigidBodyMotion)
  | { kind: "numerical"; message: string }
  /** A stored result (resultToJson) that does not fit its model or is damaged; see restoreResult. */
  | { kind: "invalid-stored-result"; path: string; message: string };

export type EngineWarning = { kind: "ill-conditioned"; loadCase: string; relativeResidual: number; message: string };

export type ErrorKind = EngineError["kind"];

/**
 * A motion of the whole structure the supports allow: a slide along x or y, or a turn about a point (where
 * every reaction acts through it), about any point of a line (every reaction acts along it), or about any point.
 */
export type RigidBodyMotion =
  | { motion: "slide-x" | "slide-y" }
  | { motion: "turn"; about?: { x: number; y: number }; node?: string; line?: { x: number } | { y: number } };

const DIRECTION_WORDS: Record<DofName, string> = {
  ux: "is free to move in x",
  uy: "is free to move in y",
  rz: "is free to rotate",
};

export function unstableError(node: string, direction: DofName): EngineError {
  return {
    kind: "unstable",
    node,
    direction,
    message: `Node ${node} ${DIRECTION_WORDS[direction]} (mechanism or missing support)`,
  };
}

function turnWords(m: Extract<RigidBodyMotion, { motion: "turn" }>): string {
  if (m.about) {
    const at = `x = ${m.about.x} m, y = ${m.about.y} m`;
    const where = m.node ? `node ${m.node} (${at})` : `the point ${at}`;
    return `about ${where}: every support reaction acts through that point and nothing holds the structure in rotation`;
  }
  if (m.line) {
    const line = "x" in m.line ? `x = ${m.line.x} m` : `y = ${m.line.y} m`;
    return `about any point of the line ${line}: every support reaction acts along that line and nothing holds the structure in rotation`;
  }
  return "about any point: no support restrains it";
}

export function rigidBodyError(m: RigidBodyMotion): EngineError {
  const message =
    m.motion === "turn"
      ? `The structure can turn as a whole ${turnWords(m)}`
      : `The structure can slide in ${m.motion === "slide-x" ? "x" : "y"} as a whole: no support restrains ${m.motion === "slide-x" ? "x" : "y"}`;
  return { kind: "rigid-body", ...m, message };
}

/** Turns a path array into the dotted form used in messages, e.g. `members[3].E`. */
export function formatPath(path: ReadonlyArray<PropertyKey>): string {
  let out = "";
  for (const part of path) {
    if (typeof part === "number") out += `[${part}]`;
    else out += out === "" ? String(part) : `.${String(part)}`;
  }
  return out;
}
