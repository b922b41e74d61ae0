import { sectionGate } from "../_components/section-gate";

// The access check above this section's loading.tsx (see section-gate.tsx): every signed-in person.
export default sectionGate(undefined);
