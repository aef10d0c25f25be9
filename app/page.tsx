import { redirect } from "next/navigation";
import { homePath } from "@/lib/auth/home";
import { getCurrentUser } from "@/lib/auth/session";

export const dynamic = "force-dynamic";

export default async function Home() {
  const user = await getCurrentUser();
  redirect(user ? homePath(user.role) : "/sign-in");
}
