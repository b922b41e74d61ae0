import { sectionGate } from "../_components/section-gate";

// The access check above the section (see section-gate.tsx); the impact report checks again itself.
export default sectionGate("runs.read");
