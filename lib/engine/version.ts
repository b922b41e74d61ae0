/**
 * The engine's identity, recorded with every run so a result can be traced to the code that made it: the semver
 * below plus the sha256 of the engine's own source (identity.generated.ts, written by `npm run engine:identity`
 * and checked by tests/engine/identity.test.ts), so a change that alters numbers can never hide behind an
 * unchanged version string.
 */
import { ENGINE_SOURCE_HASH } from "./identity.generated";

/** Semantic version of the engine. Bump it when results change, then run `npm run engine:golden`. */
// 0.2.0: a structure that can move as a whole is refused with the new error kind `rigid-body`.
export const ENGINE_VERSION = "0.2.0";

export interface EngineIdentity {
  readonly version: string;
  /** sha256 of every file under lib/engine (hex); see scripts/engine-identity.ts for what is hashed. */
  readonly sourceHash: string;
}

export const ENGINE_IDENTITY: EngineIdentity = Object.freeze({ version: ENGINE_VERSION, sourceHash: ENGINE_SOURCE_HASH });

/** The short printable form, e.g. `0.1.0+sha256:abcdef012345` (semver build metadata: the first 12 hex digits). */
export function engineIdentityLabel(identity: EngineIdentity = ENGINE_IDENTITY): string {
  return `${identity.version}+sha256:${identity.sourceHash.slice(0, 12)}`;
}
