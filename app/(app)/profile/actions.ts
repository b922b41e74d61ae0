"use server";
// The profile page's two forms, each a use case (lib/use-cases/profile.ts) that acts on the signed-in
// person only.
import { revalidatePath } from "next/cache";
import { serverAction } from "@/lib/use-cases/next";
import { changePassword, setOwnDisplayUnits, setOwnTimeZone } from "@/lib/use-cases/profile";

export const changePasswordAction = serverAction(changePassword);

export const setTimeZoneAction = serverAction(setOwnTimeZone, { then: () => revalidatePath("/profile") });

/** Results everywhere (run pages, calc sheets) follow the choice: every page is drawn again. */
export const setDisplayUnitsAction = serverAction(setOwnDisplayUnits, { then: () => revalidatePath("/", "layout") });
