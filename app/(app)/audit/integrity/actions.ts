"use server";
// The integrity page's one form: run the whole check now (lib/use-cases/log.ts).
import { serverAction } from "@/lib/use-cases/next";
import { runIntegrityCheck } from "@/lib/use-cases/log";

export const runIntegrityCheckAction = serverAction(runIntegrityCheck);
