// What an unexpected error may say in the server log. A failed database query carries its bound
// parameters: drizzle-orm's DrizzleQueryError puts them in its message ("Failed query: ...\nparams:
// ...") and so in its stack; postgres.js keeps them on the error as `parameters` (and `args`), and a
// PostgreSQL error's `detail` can quote a row's values ("Key (token_hash)=(...) already exists").
// Those values are whatever the request sent or the row held: share-link token hashes, recipients'
// addresses, passwords' hashes. The log gets the SQL text, the error's class, SQLSTATE code and
// message from the server, and the stack frames; never the values.

type Loose = Error & { query?: unknown; params?: unknown; parameters?: unknown; code?: unknown; cause?: unknown };

const PARAMS_WITHHELD = "(bound parameters withheld from the log)";

function isDrizzleQueryError(err: Loose): boolean {
  return err.name === "DrizzleQueryError" || (typeof err.message === "string" && err.message.startsWith("Failed query: ") && "params" in err);
}

/** Stack frames only: the first line of `stack` repeats the message, which is what we are replacing. */
function framesOf(err: Error): string {
  return (err.stack ?? "")
    .split("\n")
    .filter((line) => /^\s+at /.test(line))
    .join("\n");
}

function describeOne(err: unknown): string {
  if (!(err instanceof Error)) return typeof err === "string" ? err : `non-error thrown (${typeof err})`;
  const e = err as Loose;
  if (isDrizzleQueryError(e)) {
    const query = typeof e.query === "string" ? e.query : "(query text unavailable)";
    return `DrizzleQueryError: failed query: ${query} ${PARAMS_WITHHELD}`;
  }
  const isDbError = e.name === "PostgresError" || "parameters" in e;
  const code = typeof e.code === "string" ? ` [${e.code}]` : "";
  return `${e.name}${code}: ${e.message}${isDbError ? ` ${PARAMS_WITHHELD}` : ""}`;
}

/** One loggable text for an error and its causes, without any query's bound values. */
export function describeErrorForLog(err: unknown): string {
  const parts: string[] = [];
  let current: unknown = err;
  for (let depth = 0; current !== undefined && current !== null && depth < 5; depth++) {
    parts.push((depth ? "caused by: " : "") + describeOne(current));
    const frames = current instanceof Error ? framesOf(current) : "";
    if (frames) parts.push(frames);
    current = current instanceof Error ? (current as Loose).cause : undefined;
  }
  return parts.join("\n");
}
