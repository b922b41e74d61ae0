/** Semantic version of the engine; recorded with every run so a result can be traced to the code that made it. */
export const ENGINE_VERSION = "0.1.0";
