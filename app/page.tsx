import { redirect } from "next/navigation";
import { getActor } from "@/lib/auth/session";

// The bare address sends people where they belong: their home, or the sign-in page.
export default async function RootPage() {
  redirect((await getActor()) ? "/home" : "/sign-in");
}
