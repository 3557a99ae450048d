// Caddis's own tables, one file per area.
export * from "./organisations";
export * from "./patients";
export * from "./catheters";
export * from "./passports";
export * from "./portal";
export * from "./mail";
export * from "./security";
export * from "./visits";
export * from "./settings";
export * from "./transfers";
