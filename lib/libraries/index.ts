// The firm's libraries, the pure part: the section builder, the catalogue import and the demo catalogue; the
// library documents and the draft editor's forms for their materials and sets; a combination set's expansion into the
// engine's combinations; what a model takes from a material.
export { buildSection, buildSectionOrThrow, LATEST_SECTION_RULES, rectangleTorsion, SECTION_RULES } from "./sections";
export type {
  BuildSectionResult,
  Section,
  SectionProblem,
  SectionProperties,
  SectionPropertiesByShape,
  SectionRules,
} from "./sections";
export { angleTorsionConstant, channelTorsionConstant, channelWarping, iTorsionConstant, iWarping } from "./section-torsion";
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
export {
  buildDemoCatalogue,
  DEMO_CATALOGUE_FILE,
  DEMO_CATALOGUE_MAPPING,
  DEMO_SECTIONS,
  demoSectionsDocument,
  renderDemoCatalogueCsv,
} from "./demo-catalogue";
export {
  catalogueSectionEntries,
  checkLibraryDocument,
  COMBINATION_PURPOSES,
  combinationSetEntrySchema,
  findEntry,
  LIBRARY_KIND_NAMES,
  LIBRARY_KINDS,
  libraryContentHash,
  libraryDocumentInputSchema,
  libraryEntryHash,
  LOAD_ACTIONS,
  LOAD_CASE_RULES,
  MATERIAL_FAMILIES,
  materialEntrySchema,
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
export {
  COMBINATION_SET_FORM,
  combinationSetFormSchema,
  combinationSetFormValues,
  combinationSetOfForm,
  MATERIAL_FORM,
  MATERIAL_FORM_VALUES,
  materialFormSchema,
  materialFormValues,
  materialOfForm,
} from "./entry-forms";
export type { CombinationSetFormValues, EntryFormKind, MaterialFormValues } from "./entry-forms";
export { materialShearModulus, memberMaterial, shearModulusFromPoisson, STANDARD_GRAVITY, weightDensity } from "./materials";
