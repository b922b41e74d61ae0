/**
 * The standards: their source format (a YAML definition and an MDX narrative in one file) and their pure
 * evaluation, shared by the server, scripts and the browser. See content/README.md for the format.
 */
export { compileStandard, type CompiledStandard, type CompileOutcome } from "./compile";
export {
  evaluateDefinition,
  evaluationToCanonicalJson,
  EVALUATION_VERSION,
  type Evaluation,
  type EvaluationOutcome,
  type EvaluatedCheck,
  type EvaluatedExtract,
} from "./evaluate";
export { DefinitionSchema, definitionJsonSchema, type Definition } from "./definition";
export { parseSource, type SourceProblem } from "./source";
export { displayUtilisation } from "./checks";
export { formatQuantity, formatSignificant, prettyUnit } from "./format";
export { TRADE_UNITS, QUANTITIES, type Quantity } from "./units";
