// Reads pieces of mux-embed's own shipped code (node_modules/mux-embed/dist/mux.mjs) to use as the
// oracle for how it shortens beacon keys and builds the beacon URL. Nothing here is copied into the
// app: the tests compare the app's constants with what the installed SDK actually does.
import { readFileSync } from "node:fs";
import path from "node:path";

const source = readFileSync(path.resolve(__dirname, "../../../node_modules/mux-embed/dist/mux.mjs"), "utf8");

function objectLiteralContaining(marker: string): Record<string, string> {
  const at = source.indexOf(marker);
  if (at < 0) throw new Error(`mux-embed source changed: ${marker} not found`);
  const start = source.lastIndexOf("{", at);
  const end = source.indexOf("}", at);
  const out: Record<string, string> = {};
  for (const m of source.slice(start + 1, end).matchAll(/(\w+):"([^"]*)"/g)) out[m[1]] = m[2];
  return out;
}

/** short -> long, first word of a key ("x" -> "view") */
export const FIRST_WORDS = objectLiteralContaining('a:"env",b:"beacon"');
/** short -> long, later words ("wa" -> "watch") */
export const LATER_WORDS = objectLiteralContaining('ad:"ad",af:"affiliate"');

/** The SDK's beacon-URL function, compiled from its own source text. */
export function muxBeaconUrlFunction(): (envKey: string | undefined, options: { beaconCollectionDomain?: string; beaconDomain?: string }) => string {
  const m = /function (\w+)\((\w+),(\w+)\)\{var \w+=\3\.beaconCollectionDomain/.exec(source);
  if (!m) throw new Error("mux-embed source changed: beacon URL function not found");
  let depth = 0;
  let i = source.indexOf("{", m.index);
  const bodyStart = i;
  for (; i < source.length; i++) {
    if (source[i] === "{") depth++;
    else if (source[i] === "}" && --depth === 0) break;
  }
  const body = source.slice(bodyStart + 1, i);
  return new Function(m[2], m[3], body) as never;
}
