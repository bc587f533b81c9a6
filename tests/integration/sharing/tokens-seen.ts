// Raw tokens handed out during this test run, kept in memory only, so a later test can search the
// database and logs for them.
export const tokensSeen: string[] = [];
