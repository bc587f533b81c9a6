import { describe, expect, it } from "vitest";
import { SHORTCUTS, shortcutFor } from "@/components/player/review-shortcuts";

const press = (key: string, target: { tagName: string; isContentEditable?: boolean } | null = { tagName: "BODY" }, mods: Partial<{ ctrlKey: boolean; metaKey: boolean; altKey: boolean }> = {}) =>
  shortcutFor({ key, ctrlKey: false, metaKey: false, altKey: false, ...mods, target: target as unknown as EventTarget });

describe("review shortcuts", () => {
  it("maps the documented keys", () => {
    expect(press(",")).toBe("frame-back");
    expect(press(".")).toBe("frame-forward");
    expect(press(" ")).toBe("toggle-play");
    expect(press("k")).toBe("toggle-play");
    expect(press("?")).toBe("help");
  });

  it("stays out of the way while typing, with modifiers, and for Space on a button", () => {
    for (const tagName of ["INPUT", "TEXTAREA", "SELECT"]) expect(press(".", { tagName })).toBeNull();
    expect(press(".", { tagName: "DIV", isContentEditable: true })).toBeNull();
    expect(press(",", { tagName: "BODY" }, { ctrlKey: true })).toBeNull();
    expect(press(" ", { tagName: "BUTTON" })).toBeNull();
    expect(press(".", { tagName: "BUTTON" })).toBe("frame-forward");
  });

  it("lists every action in the help overlay once", () => {
    const actions = SHORTCUTS.map((s) => s.action);
    expect(new Set(actions).size).toBe(actions.length);
  });
});
