// Intentionally empty: see package.json. Next.js resolves `server-only` itself (its built-in copy,
// an error in the client bundle, empty on the server), so this copy is only ever loaded by plain
// Node: the worker, db/migrate.ts, db/seed.ts and the benchmarks, where the npm package's default
// export would throw.
