import { sectionGate } from "../../_components/section-gate";

// The access check above this page's loading.tsx (see section-gate.tsx): the run log is not the audit trail's
// (leads read it, who do not read the trail), so it has a gate of its own.
export default sectionGate("run-log.read");
