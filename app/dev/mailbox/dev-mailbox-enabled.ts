// The development mailbox exists in development and on a local `npm start` (CAIRN_LOCAL=1), never on a production server.
export function devMailboxEnabled(): boolean {
  return process.env.NODE_ENV !== "production" || process.env.CAIRN_LOCAL === "1";
}
