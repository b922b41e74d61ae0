import { sectionGate } from "../../_components/section-gate";

// The access check above this section's loading.tsx (see section-gate.tsx).
export default sectionGate("audit.read");
