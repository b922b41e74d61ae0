// The firm's libraries, the pure part: the section builder, the catalogue import and the demo catalogue; the
// library documents; a combination set's expansion into the engine's combinations; what a model takes from a material.
export { buildSection, buildSectionOrThrow, rectangleTorsion } from "./sections";
export type { BuildSectionResult, Section, SectionProblem, SectionProperties, SectionPropertiesByShape } from "./sections";
export { DIMENSION_LABELS, SECTION_SHAPES, SHAPE_NAMES, sectionInputSchema } from "./section-schema";
export type { DimensionKey, SectionDimensions, SectionInput, SectionShape } from "./section-schema";
export { convertToSI, importCatalogue, LISTED_PROPERTY_UNITS, unitFactor } from "./catalogue";
export type {
  CatalogueDifference,
  CatalogueImport,
  CatalogueMapping,
  CatalogueOptions,
  CatalogueProblem,
  CatalogueRow,
  ColumnSpec,
  ListedProperty,
} from "./catalogue";
export { parseCsv } from "./csv";
export { buildDemoCatalogue, DEMO_CATALOGUE_MAPPING, DEMO_SECTIONS, renderDemoCatalogueCsv } from "./demo-catalogue";
export {
  catalogueSectionEntries,
  checkLibraryDocument,
  findEntry,
  LIBRARY_KIND_NAMES,
  LIBRARY_KINDS,
  libraryContentHash,
  libraryDocumentInputSchema,
  libraryEntryHash,
  MATERIAL_FAMILIES,
  MATERIAL_VALUE_UNITS,
  normaliseKey,
} from "./document";
export type {
  CheckedLibraryDocument,
  CombinationSetEntry,
  LibraryDocument,
  LibraryDocumentInput,
  LibraryEntry,
  LibraryKind,
  LibraryProblem,
  MaterialEntry,
  SectionEntry,
  SectionEntryInput,
} from "./document";
export { expandCombinationSet, expandCombinationSetOrThrow, MAX_EXPANDED_COMBINATIONS } from "./combination-sets";
export type {
  CombinationOrigin,
  DroppedCombination,
  EngineCombination,
  ExpandCombinationSetResult,
  ExpandOptions,
  ExpansionProblem,
} from "./combination-sets";
export { materialShearModulus, memberMaterial, shearModulusFromPoisson, STANDARD_GRAVITY, weightDensity } from "./materials";
