// One way to state who may do what to a resource through its API, shared by the per-resource API
// tests: a table of expected statuses per actor (the demo roles, a member of another organisation and
// nobody signed in), one test per actor, and one comparison of the statuses got against the row, so a
// failure names the actor and every column at once.
import { expect, it } from "vitest";
import { req, route, type Actor, type DemoActorKey } from "./session";

type Handler = (req: Request, ctx: { params: Promise<{ id: string }> }) => Promise<Response>;
type ListModule = { GET: (req: Request) => Promise<Response>; POST: (req: Request) => Promise<Response> };
type OneModule = { GET: Handler; PATCH: Handler; DELETE: Handler };

/** One test per actor: `run` does what the columns name and returns each status; they must equal the row. */
export function roleMatrix<K extends string>(
  columns: readonly K[],
  expected: Partial<Record<DemoActorKey, readonly number[]>>,
  run: (who: DemoActorKey, want: Record<K, number>) => Promise<Record<K, number>>,
) {
  for (const [who, statuses] of Object.entries(expected) as [DemoActorKey, readonly number[]][]) {
    const want = Object.fromEntries(columns.map((c, i) => [c, statuses[i]])) as Record<K, number>;
    it(`${who}: ${columns.map((c) => `${c} ${want[c]}`).join(", ")}`, async () => {
      expect(await run(who, want)).toEqual(want);
    });
  }
}

export const CRUD_COLUMNS = ["list", "create", "read", "edit", "archive"] as const;
export type CrudStatuses = Record<(typeof CRUD_COLUMNS)[number], number>;

/**
 * The usual five requests on a resource of `/api/<path>` and `/api/<path>/:id` (DELETE archives): a
 * fresh record is made for each actor, then listed, created, read, edited and archived by that actor.
 * `effects` checks what the database holds afterwards against the statuses wanted.
 */
export function crudRoleMatrix(opts: {
  path: string;
  list: ListModule;
  one: OneModule;
  actors: () => Record<DemoActorKey, Actor>;
  expected: Partial<Record<DemoActorKey, readonly number[]>>;
  make: (who: DemoActorKey) => Promise<{ id: string }>;
  createBody: (who: DemoActorKey) => unknown;
  editBody: (who: DemoActorKey) => unknown;
  effects: (who: DemoActorKey, id: string, want: CrudStatuses) => Promise<void>;
}) {
  roleMatrix(CRUD_COLUMNS, opts.expected, async (who, want) => {
    const a = opts.actors()[who];
    const { id } = await opts.make(who);
    const at = route({ id });
    const base = `/api/${opts.path}`;
    const got: CrudStatuses = {
      list: (await opts.list.GET(await req(a, "GET", base))).status,
      create: (await opts.list.POST(await req(a, "POST", base, opts.createBody(who)))).status,
      read: (await opts.one.GET(await req(a, "GET", `${base}/${id}`), at)).status,
      edit: (await opts.one.PATCH(await req(a, "PATCH", `${base}/${id}`, opts.editBody(who)), at)).status,
      archive: (await opts.one.DELETE(await req(a, "DELETE", `${base}/${id}`), at)).status,
    };
    await opts.effects(who, id, want);
    return got;
  });
}
