export * from "./organisations";
export * from "./users";
export * from "./projects";
export * from "./sheets";
export * from "./audit";
export * from "./uploads";
export * from "./mail";
export * from "./tokens";
