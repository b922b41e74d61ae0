import "server-only";
import { notFound } from "next/navigation";
import { AppError } from "@/lib/domain/errors";

/** A record that does not exist, or an address that cannot name one, is the 404 page. */
export async function orNotFound<T>(load: () => Promise<T>): Promise<T> {
  try {
    return await load();
  } catch (error) {
    if (error instanceof AppError && (error.code === "not-found" || error.code === "invalid-input")) notFound();
    throw error;
  }
}
