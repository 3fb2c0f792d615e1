import { AppShell } from "@/components/shell/app-shell";
import { devNavItems, navItems } from "@/components/shell/nav-items";
import { StatusSlot } from "@/components/shell/status-slot";
import { requirePageUser } from "@/lib/auth/session";
import { config } from "@/lib/env";

export default async function DeskLayout({ children }: { children: React.ReactNode }) {
  const user = await requirePageUser();
  const all = config().NODE_ENV === "production" ? navItems : [...navItems, ...devNavItems];
  const items = all.filter((item) => item.roles.includes(user.role));
  return (
    <AppShell user={user} items={items} statusSlot={<StatusSlot />}>
      {children}
    </AppShell>
  );
}
