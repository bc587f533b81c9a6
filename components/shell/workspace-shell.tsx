"use client";
// The signed-in frame: navigation, organisation name, user menu (organisation switcher, sign-out), dim toggle.
// Below 1280 px the navigation folds behind a "Menu" button (a disclosure: aria-expanded, Escape closes
// it and returns focus to the button), so a phone's header stays one row instead of three.
import Link from "next/link";
import { usePathname } from "next/navigation";
import { signOut } from "next-auth/react";
import { useEffect, useRef, useState, useSyncExternalStore } from "react";
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
  { href: "/disposal", label: "Disposal", roles: ["owner"] },
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

  const [menuOpen, setMenuOpen] = useState(false);
  const [menuPath, setMenuPath] = useState(path);
  const menuButton = useRef<HTMLButtonElement>(null);
  // a followed link closes the menu (state adjusted during render, not in an effect)
  if (menuPath !== path) {
    setMenuPath(path);
    setMenuOpen(false);
  }
  const links = NAV.filter((n) => !n.roles || n.roles.includes(role));
  const current = links.find((n) => path === n.href || path.startsWith(`${n.href}/`));

  return (
    <div className="flex min-h-screen flex-col">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:bg-paper focus:p-2">
        Skip to content
      </a>
      <header className="relative border-b border-line bg-paper">
        <div className="mx-auto flex max-w-7xl items-center gap-2 px-4 py-2 xl:gap-4">
          <Link href="/today" aria-label="Cairn home" className="shrink-0">
            <CairnMark />
          </Link>
          {/* the organisation's name: a chip where the row has room, else the menu's first line and the user menu */}
          <span className="hidden min-w-0 truncate rounded bg-paper-2 px-2 py-1 text-sm font-medium sm:inline xl:hidden 2xl:inline" data-testid="org-name">
            {organisationName}
          </span>
          <nav
            aria-label="Workspace"
            onKeyDown={(e) => {
              if (e.key === "Escape" && menuOpen) {
                setMenuOpen(false);
                menuButton.current?.focus();
              }
            }}
          >
            <button
              ref={menuButton}
              type="button"
              className="inline-flex min-h-10 items-center gap-2 rounded-md border border-line px-3 text-sm xl:hidden"
              aria-expanded={menuOpen}
              aria-controls="workspace-nav-list"
              onClick={() => setMenuOpen(!menuOpen)}
              data-testid="nav-menu-button"
            >
              <span aria-hidden>{menuOpen ? "✕" : "☰"}</span>
              Menu
              {current && <span className="sr-only">, now on {current.label}</span>}
            </button>
            <ul
              id="workspace-nav-list"
              className={`${menuOpen ? "flex" : "hidden"} absolute inset-x-0 top-full z-30 flex-col gap-1 border-b border-line bg-paper p-2 shadow-lg xl:static xl:flex xl:flex-row xl:flex-wrap xl:gap-0.5 xl:border-0 xl:p-0 xl:shadow-none`}
            >
              <li className="px-3 py-1 text-xs text-ink-2 sm:hidden">{organisationName}</li>
              {links.map((n) => {
                const active = n === current;
                return (
                  <li key={n.href}>
                    <Link
                      href={n.href}
                      aria-current={active ? "page" : undefined}
                      className={`block rounded-md px-3 py-2 text-sm xl:px-2.5 ${active ? "bg-lake text-on-lake" : "hover:bg-paper-2"}`}
                    >
                      {n.label}
                    </Link>
                  </li>
                );
              })}
            </ul>
          </nav>
          <div className="ml-auto flex shrink-0 items-center gap-2">
            <button
              type="button"
              className="min-h-10 rounded-md border border-line px-2 py-1 text-xs"
              onClick={() => storeDarkTheme(!dark)}
              aria-pressed={dark}
            >
              {dark ? "Daylight" : "Dim"}
            </button>
            <details className="relative">
              <summary className="cursor-pointer list-none rounded-md px-3 py-2 text-sm hover:bg-paper-2" data-testid="user-menu">
                <span className="inline-block max-w-28 truncate align-bottom sm:max-w-none">{userName}</span>
                <span className="hidden text-ink-2 sm:inline xl:hidden 2xl:inline"> · {ROLE_LABELS[role].label}</span>
              </summary>
              <div className="absolute right-0 z-20 mt-1 w-64 max-w-[calc(100vw-2rem)] rounded-md border border-line bg-paper p-3 text-sm shadow-lg">
                <p className="font-medium">{userName}</p>
                <p className="break-all text-ink-2">{userEmail}</p>
                <p className="mt-1 text-xs font-medium">{organisationName}</p>
                <p className="mt-1 text-xs text-ink-2">{ROLE_LABELS[role].label}: {ROLE_LABELS[role].meaning}</p>
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
