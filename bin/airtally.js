#!/usr/bin/env node
/* The airtally command: runs src/cli/main.ts through tsx (TypeScript without a build step). */
"use strict";
require("tsx/cjs/api").register();
const { main } = require("../src/cli/main.ts");
main(process.argv.slice(2)).then((code) => {
  process.exitCode = code;
});
