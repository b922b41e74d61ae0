import { AppError } from "@/lib/domain/errors";

/** The AppError a call was refused with; fails the test when the call succeeds or throws anything else. */
export async function refusal(work: Promise<unknown>): Promise<AppError> {
  try {
    await work;
  } catch (error) {
    if (error instanceof AppError) return error;
    throw error;
  }
  throw new Error("expected the call to be refused");
}
