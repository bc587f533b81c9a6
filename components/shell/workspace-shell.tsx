"use client";
// The signed-in frame: navigation, organisation name, user menu (organisation switcher, sign-out), dim toggle.
import Link from "next/link";
import { usePathname } from "next/navigation";
import { signOut } from "next-auth/react";
import { useEffect, useSyncExternalStore } from "react";
import { CairnMark } from "@/components/ui/cairn-mark";
import type { OrganisationChoice } from "@/lib/auth/organisations-of-user";
import { OrganisationSwitcher } from "./organisation-switcher";
import { ROLE_LABELS } from "@/lib/auth/permissions";
import type { Role } from "@/db/schema/types";

const NAV: { href: string; label: string; roles?: Role[] }[] = [
  { href: "/today", label: "Today" },
  { href: "/jobs", label: "Jobs" },
  { href: "/flights", label: "Flights" },
  { href: "/upload", label: "Upload", roles: ["owner", "pilot"] },
  { href: "/clients", label: "Clients" },
  { href: "/sites", label: "Sites" },
  { href: "/range", label: "Range & distance", roles: ["owner", "pilot", "reviewer"] },
  { href: "/custody", label: "Custody log", roles: ["owner", "pilot", "reviewer"] },
  { href: "/members", label: "Members", roles: ["owner"] },
];


// The dim theme is remembered in this browser (localStorage) and shared by every open tab.
const THEME_KEY = "cairn-theme";
const themeListeners = new Set<() => void>();

function subscribeTheme(onChange: () => void): () => void {
  themeListeners.add(onChange);
  window.addEventListener("storage", onChange);
  return () => {
    themeListeners.delete(onChange);
    window.removeEventListener("storage", onChange);
  };
}

const readDarkTheme = () => localStorage.getItem(THEME_KEY) === "dark";

function storeDarkTheme(dark: boolean) {
  localStorage.setItem(THEME_KEY, dark ? "dark" : "light");
  themeListeners.forEach((l) => l());
}

export function WorkspaceShell({
  children,
  organisationId,
  organisationName,
  organisations,
  userName,
  userEmail,
  role,
}: {
  children: React.ReactNode;
  organisationId: string;
  organisationName: string;
  organisations: OrganisationChoice[];
  userName: string;
  userEmail: string;
  role: Role;
}) {
  const path = usePathname();
  // the server renders daylight; the browser then reads the stored choice
  const dark = useSyncExternalStore(subscribeTheme, readDarkTheme, () => false);
  useEffect(() => {
    document.documentElement.classList.toggle("dark", dark);
  }, [dark]);

  return (
    <div className="flex min-h-screen flex-col">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:bg-paper focus:p-2">
        Skip to content
      </a>
      <header className="border-b border-line bg-paper">
        <div className="mx-auto flex max-w-7xl flex-wrap items-center gap-4 px-4 py-2">
          <Link href="/today" aria-label="Cairn home">
            <CairnMark />
          </Link>
          <span className="rounded bg-paper-2 px-2 py-1 text-sm font-medium" data-testid="org-name">
            {organisationName}
          </span>
          <nav aria-label="Workspace" className="flex flex-wrap gap-1">
            {NAV.filter((n) => !n.roles || n.roles.includes(role)).map((n) => {
              const active = path === n.href || path.startsWith(`${n.href}/`);
              return (
                <Link
                  key={n.href}
                  href={n.href}
                  aria-current={active ? "page" : undefined}
                  className={`rounded-md px-3 py-2 text-sm ${active ? "bg-lake text-white" : "hover:bg-paper-2"}`}
                >
                  {n.label}
                </Link>
              );
            })}
          </nav>
          <div className="ml-auto flex items-center gap-2">
            <button
              type="button"
              className="rounded-md border border-line px-2 py-1 text-xs"
              onClick={() => storeDarkTheme(!dark)}
              aria-pressed={dark}
            >
              {dark ? "Daylight" : "Dim"}
            </button>
            <details className="relative">
              <summary className="cursor-pointer list-none rounded-md px-3 py-2 text-sm hover:bg-paper-2" data-testid="user-menu">
                {userName} <span className="text-ink-2">· {ROLE_LABELS[role].label}</span>
              </summary>
              <div className="absolute right-0 z-20 mt-1 w-64 rounded-md border border-line bg-paper p-3 text-sm shadow-lg">
                <p className="font-medium">{userName}</p>
                <p className="text-ink-2">{userEmail}</p>
                <p className="mt-1 text-xs text-ink-2">{ROLE_LABELS[role].meaning}</p>
                <OrganisationSwitcher currentId={organisationId} organisations={organisations} />
                <button type="button" className="mt-3 w-full rounded-md border border-line px-3 py-2 hover:bg-paper-2" onClick={() => signOut({ callbackUrl: "/sign-in" })}>
                  Sign out
                </button>
              </div>
            </details>
          </div>
        </div>
      </header>
      <main id="main" className="mx-auto w-full max-w-7xl flex-1 px-4 py-6">
        {children}
      </main>
    </div>
  );
}
