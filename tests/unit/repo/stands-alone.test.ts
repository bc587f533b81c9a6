// The repository stands on its own: a comment or a doc cites a public source (a standard, an RFC, a
// library's documentation) or a file of this repository, never a document a reader cannot open. This
// test reads every text file git knows (tracked, plus new files not ignored) and fails on
//   - a cited Markdown file that is not here (a bare name must be the name of some file here; a path
//     must resolve from the repository root or the citing file's folder, or be the end of a file's
//     path), unless it is part of a URL or one of the public documents listed in PUBLIC_MD below;
//   - notes that were never part of the repository, by the names they went under.
// The patterns below spell those names with a character class, so this file does not match itself.
import { execFileSync } from "node:child_process";
import { existsSync, lstatSync, readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";

const root = path.resolve(__dirname, "../../..");

/** Public `.md` documents that comments may cite by name, each with where a reader finds it. */
const PUBLIC_MD: Record<string, string> = {
  "protocol.md": "tus.io: the tus resumable upload protocol 1.0.0 (github.com/tus/tus-resumable-upload-protocol)",
};

/** Names of notes kept outside the repository, which no file may send a reader to. */
const OUTSIDE_NOTES: { pattern: RegExp; what: string }[] = [
  { pattern: /\bSTACK-?NOTE[S]\b/, what: "stack notes kept outside the repository" },
  { pattern: /\.\.\/share[d]\b/, what: "a folder outside the repository" },
  { pattern: /\bshare[d]\/[A-Z]/, what: "a folder outside the repository" },
  { pattern: /\bbrie[f]\b/i, what: "a document outside the repository" },
  { pattern: /\bCE[O]\b/, what: "a person outside the repository" },
];

const SKIP = new Set(["package-lock.json"]);

function gitFiles(): string[] {
  const out = execFileSync("git", ["ls-files", "-z", "--cached", "--others", "--exclude-standard"], { cwd: root, encoding: "utf8", maxBuffer: 64 * 1024 * 1024 });
  // regular files only: a symbolic link (say a node_modules link in a second checkout) or a submodule is no text of ours
  return [...new Set(out.split("\0").filter(Boolean))].filter((f) => existsSync(path.join(root, f)) && lstatSync(path.join(root, f)).isFile());
}

function textOf(file: string): string | undefined {
  if (SKIP.has(path.basename(file))) return undefined;
  const bytes = readFileSync(path.join(root, file));
  if (bytes.length > 4 * 1024 * 1024 || bytes.includes(0)) return undefined; // binary or data, not prose
  return bytes.toString("utf8");
}

const files = gitFiles();
const fileSet = new Set(files);
const basenames = new Set(files.map((f) => path.basename(f)));
const texts = files.map((file) => ({ file, text: textOf(file) })).filter((t): t is { file: string; text: string } => t.text !== undefined);

/** Does the `.md` cited in `file` exist in the repository? */
function resolvesInRepo(cited: string, file: string): boolean {
  const clean = cited.replace(/^\.\//, "");
  if (!clean.includes("/")) return basenames.has(clean);
  const candidates = [path.posix.normalize(clean), path.posix.normalize(path.posix.join(path.posix.dirname(file), clean))];
  if (candidates.some((c) => fileSet.has(c))) return true;
  // a path written relative to a nearby folder ("fixtures/README.md" beside tests/unit/geo/)
  return !clean.startsWith("../") && files.some((f) => f.endsWith(`/${clean}`));
}

/** The problems in one file's text: each as "file:line: what". */
function problemsIn(file: string, text: string): string[] {
  const problems: string[] = [];
  text.split("\n").forEach((line, i) => {
    for (const m of line.matchAll(/[\w@-][\w./@-]*\.md\b/g)) {
      const cited = m[0];
      const word = line.slice(line.lastIndexOf(" ", m.index) + 1, m.index + cited.length);
      if (word.includes("://")) continue; // part of a URL: a public address
      if (PUBLIC_MD[path.basename(cited)] || resolvesInRepo(cited, file)) continue;
      problems.push(`${file}:${i + 1}: cites ${cited}, which is not in the repository`);
    }
    for (const { pattern, what } of OUTSIDE_NOTES) {
      const m = pattern.exec(line);
      if (m) problems.push(`${file}:${i + 1}: "${m[0]}" names ${what}`);
    }
  });
  return problems;
}

describe("the repository stands on its own", () => {
  it("reads the files git knows, including this one and the docs", () => {
    expect(texts.length).toBeGreaterThan(100);
    expect(fileSet.has("tests/unit/repo/stands-alone.test.ts")).toBe(true);
    expect(texts.some((t) => t.file === "DEVELOPERS.md")).toBe(true);
  });

  it("flags a citation of a missing document and passes the repository's own files", () => {
    const missing = ["NOTES", "md"].join("."); // built here so this file itself cites nothing missing
    expect(problemsIn("lib/x.ts", `// the rule (${missing})`)).toHaveLength(1);
    expect(problemsIn("lib/x.ts", `// the rule (docs/${missing})`)).toHaveLength(1);
    expect(problemsIn("lib/x.ts", `// ${["STACK", "NOTES"].join("-")}: a trap`)).toHaveLength(1);
    expect(problemsIn("lib/x.ts", `// as the ${["bri", "ef"].join("")} says`)).toHaveLength(1);
    expect(problemsIn("lib/x.ts", "// see DEVELOPERS.md and ../DEVELOPERS.md")).toEqual([]);
    expect(problemsIn("tests/unit/geo/x.test.ts", "// see fixtures/README.md")).toEqual([]);
    expect(problemsIn("lib/x.ts", "// tus 1.0.0 (tus.io protocol.md; https://example.org/a/b.md)")).toEqual([]);
  });

  it("no file cites a document that is not in the repository", () => {
    expect(texts.flatMap(({ file, text }) => problemsIn(file, text))).toEqual([]);
  });

  it("each public .md it allows says where a reader finds it", () => {
    for (const [name, where] of Object.entries(PUBLIC_MD)) expect(where, name).toMatch(/\w+\.\w+/);
  });
});
