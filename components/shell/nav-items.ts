import { can, type Role } from "@/lib/auth/roles";

export interface NavItem {
  href: string;
  label: string;
  icon: "triage" | "follow-up" | "candidates" | "rota" | "review" | "sites" | "settings" | "users" | "dead-letters" | "mailbox" | "notifications";
  /** who sees it in the menu; the page guards itself on the server regardless */
  roles: readonly Role[];
}

const everyone = can.read;

export const navItems: NavItem[] = [
  { href: "/triage", label: "Triage board", icon: "triage", roles: everyone },
  { href: "/follow-up", label: "Follow-up board", icon: "follow-up", roles: everyone },
  { href: "/candidates", label: "Candidates", icon: "candidates", roles: everyone },
  { href: "/rota", label: "Rota", icon: "rota", roles: everyone },
  { href: "/review", label: "Review", icon: "review", roles: everyone },
  { href: "/sites", label: "Sites", icon: "sites", roles: everyone },
  { href: "/notifications", label: "Call-outs", icon: "notifications", roles: everyone },
  { href: "/settings", label: "Settings", icon: "settings", roles: everyone },
  { href: "/admin/users", label: "People & roles", icon: "users", roles: can.manageUsers },
  { href: "/dead-letters", label: "Rejected feed posts", icon: "dead-letters", roles: can.readDeliveryFailures },
];

export const devNavItems: NavItem[] = [{ href: "/dev/mailbox", label: "Dev mailbox", icon: "mailbox", roles: everyone }];

/** Where each role starts after signing in. */
export const homeFor: Record<Role, string> = {
  shifter: "/triage",
  observer: "/follow-up",
  coordinator: "/triage",
  admin: "/admin/users",
};
