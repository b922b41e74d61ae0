// Paging through the audit trail (search params of the audit page and of GET /api/audit-events).
import { z } from "../zod";

export const listAuditEventsSchema = z.object({
  limit: z.coerce.number().int().min(1).max(200).default(50),
  before: z.coerce.number().int().positive().optional(),
});
export type ListAuditEventsInput = z.infer<typeof listAuditEventsSchema>;
