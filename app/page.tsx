import { redirect } from "next/navigation";
import { homeFor } from "@/components/shell/nav-items";
import { requirePageUser } from "@/lib/auth/session";

export default async function Home() {
  const user = await requirePageUser();
  redirect(homeFor[user.role]);
}
