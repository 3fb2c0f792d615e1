"use client";

import {
  Bell,
  CalendarClock,
  ClipboardList,
  Inbox,
  LayoutGrid,
  LineChart,
  LogOut,
  Mail,
  Menu,
  Moon,
  Settings,
  Sun,
  Telescope,
  TriangleAlert,
  Users,
  Waves,
  X,
  type LucideIcon,
} from "lucide-react";
import Link from "next/link";
import { usePathname } from "next/navigation";
import { signOutAndLeave } from "./sign-out";
import { useTheme } from "next-themes";
import { useState, useSyncExternalStore } from "react";
import type { SessionUser } from "@/lib/auth/roles";
import { roleLabels } from "@/lib/auth/roles";
import { Avatar } from "@/components/ui/avatar";
import { cn } from "@/components/ui/cn";
import type { NavItem } from "./nav-items";

const icons: Record<NavItem["icon"], LucideIcon> = {
  triage: LayoutGrid,
  "follow-up": Telescope,
  candidates: Waves,
  rota: CalendarClock,
  review: LineChart,
  sites: ClipboardList,
  settings: Settings,
  users: Users,
  "dead-letters": TriangleAlert,
  mailbox: Mail,
  notifications: Bell,
};

const noSubscribe = () => () => {};

function ThemeToggle() {
  const { resolvedTheme, setTheme } = useTheme();
  // The stored theme is only known in the browser: render the server's default until hydrated.
  const hydrated = useSyncExternalStore(noSubscribe, () => true, () => false);
  const dark = !hydrated || resolvedTheme !== "light";
  return (
    <button
      type="button"
      onClick={() => setTheme(dark ? "light" : "dark")}
      className="rounded-md p-2 text-muted hover:bg-raised hover:text-fg"
      aria-label={dark ? "Switch to light theme" : "Switch to dark theme"}
      title={dark ? "Light theme" : "Dark theme"}
    >
      {dark ? <Sun className="h-4 w-4" aria-hidden /> : <Moon className="h-4 w-4" aria-hidden />}
    </button>
  );
}

/**
 * The main links. `rail`: the desktop sidebar, which below the 2xl breakpoint shows icons only (a laptop's width
 * goes to the boards' six columns); the names stay in the accessibility tree and show as tooltips.
 */
function NavList({ items, onNavigate, rail = false }: { items: NavItem[]; onNavigate?: () => void; rail?: boolean }) {
  const pathname = usePathname();
  return (
    <ul className="space-y-0.5">
      {items.map((item) => {
        const Icon = icons[item.icon];
        const active = pathname === item.href || pathname.startsWith(`${item.href}/`);
        return (
          <li key={item.href}>
            <Link
              href={item.href}
              onClick={onNavigate}
              aria-current={active ? "page" : undefined}
              title={rail ? item.label : undefined}
              className={cn(
                "flex items-center gap-2.5 rounded-md px-2.5 py-2 text-sm",
                rail && "justify-center 2xl:justify-start",
                active ? "bg-accent/15 font-medium text-fg" : "text-muted hover:bg-raised hover:text-fg",
              )}
            >
              <Icon aria-hidden className={cn("h-4 w-4 shrink-0", active && "text-accent")} />
              <span className={rail ? "sr-only 2xl:not-sr-only" : undefined}>{item.label}</span>
            </Link>
          </li>
        );
      })}
    </ul>
  );
}

export function AppShell({
  user,
  items,
  statusSlot,
  children,
}: {
  user: SessionUser;
  items: NavItem[];
  /** live-connection state and notification bell, filled by the boards and paging areas */
  statusSlot?: React.ReactNode;
  children: React.ReactNode;
}) {
  const [menuOpen, setMenuOpen] = useState(false);
  return (
    <div className="flex min-h-dvh">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:z-50 focus:rounded focus:bg-accent focus:px-3 focus:py-2 focus:text-accent-fg">
        Skip to content
      </a>
      <nav
        aria-label="Main"
        className="no-print sticky top-0 hidden h-dvh w-14 shrink-0 flex-col border-r border-line bg-surface px-1.5 py-3 lg:flex 2xl:w-56 2xl:px-3"
      >
        <Link href="/" className="mb-5 flex items-center justify-center gap-2 px-2 pt-1 2xl:justify-start" title="Chirpdesk">
          <Inbox className="h-5 w-5 shrink-0 text-accent" aria-hidden />
          <span className="sr-only text-base font-semibold tracking-tight 2xl:not-sr-only">Chirpdesk</span>
        </Link>
        <NavList items={items} rail />
        <div className="mt-auto border-t border-line pt-3">
          <UserBlock user={user} rail />
        </div>
      </nav>
      {menuOpen ? (
        <div className="fixed inset-0 z-40 lg:hidden" role="dialog" aria-modal="true" aria-label="Menu">
          <div className="absolute inset-0 bg-black/60" onClick={() => setMenuOpen(false)} />
          <nav aria-label="Main" className="absolute inset-y-0 left-0 flex w-64 flex-col bg-surface p-3">
            <div className="mb-4 flex items-center justify-between px-2">
              <span className="font-semibold">Chirpdesk</span>
              <button type="button" onClick={() => setMenuOpen(false)} aria-label="Close menu" className="p-2 text-muted">
                <X className="h-4 w-4" aria-hidden />
              </button>
            </div>
            <NavList items={items} onNavigate={() => setMenuOpen(false)} />
            <div className="mt-auto border-t border-line pt-3">
              <UserBlock user={user} />
            </div>
          </nav>
        </div>
      ) : null}
      <div className="flex min-w-0 flex-1 flex-col">
        <header className="no-print sticky top-0 z-30 flex h-12 items-center gap-2 border-b border-line bg-bg/90 px-3 backdrop-blur">
          <button
            type="button"
            className="rounded-md p-2 text-muted hover:bg-raised lg:hidden"
            onClick={() => setMenuOpen(true)}
            aria-label="Open menu"
          >
            <Menu className="h-5 w-5" aria-hidden />
          </button>
          <span className="font-semibold lg:hidden">Chirpdesk</span>
          <div className="ml-auto flex items-center gap-1">
            {statusSlot}
            <span className="hidden text-sm text-muted sm:inline" data-testid="whoami">
              {user.name} · <span className="text-fg">{roleLabels[user.role]}</span>
            </span>
            <ThemeToggle />
          </div>
        </header>
        <main id="main" className="min-w-0 flex-1 p-3 sm:p-5">
          {children}
        </main>
      </div>
    </div>
  );
}

function UserBlock({ user, rail = false }: { user: SessionUser; rail?: boolean }) {
  return (
    <div className={cn("flex items-center gap-2 px-1", rail && "flex-col 2xl:flex-row")}>
      <Avatar name={user.name} initials={user.initials} className="h-8 w-8 shrink-0 text-xs" />
      <div className={cn("min-w-0 flex-1", rail && "sr-only 2xl:not-sr-only")}>
        <p className="truncate text-sm font-medium">{user.name}</p>
        <p className="text-xs text-muted" data-testid="role-label">
          {roleLabels[user.role]}
        </p>
      </div>
      <button
        type="button"
        onClick={() => void signOutAndLeave()}
        className="rounded-md p-2 text-muted hover:bg-raised hover:text-fg"
        aria-label="Sign out"
        title="Sign out"
      >
        <LogOut className="h-4 w-4" aria-hidden />
      </button>
    </div>
  );
}
