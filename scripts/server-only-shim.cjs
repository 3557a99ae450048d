// Scripts run outside Next.js import modules marked `import "server-only"`; outside a React
// Server Components bundle that package throws on purpose. Scripts are server code, so map it
// to the package's own empty module.
const Module = require("node:module");
const path = require("node:path");
const empty = path.join(__dirname, "../node_modules/server-only/empty.js");
const original = Module._resolveFilename;
Module._resolveFilename = function (request, ...rest) {
  if (request === "server-only") return empty;
  return original.call(this, request, ...rest);
};
