export * from "./canonical-serialize";
export * from "./chain-hash";
export * from "./custody-payload";
export * from "./link-custody-event";
export * from "./verify-chain";
export * from "./sha256-stream";
