export * from "./enums";
export * from "./organisations";
export * from "./work";
export * from "./media";
export * from "./review";
export * from "./sharing";
export * from "./evidence";
export * from "./relations";
