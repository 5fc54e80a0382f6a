/** jest: ts-jest compiles TypeScript to CommonJS for Node; tests mirror src/ under test/. */
module.exports = {
  testEnvironment: "node",
  roots: ["<rootDir>/test"],
  testMatch: ["**/*.test.ts"],
  transform: {
    "^.+\\.ts$": ["ts-jest", { tsconfig: { module: "commonjs", moduleResolution: "bundler", isolatedModules: true, ignoreDeprecations: "6.0" }, diagnostics: { ignoreCodes: ["TS151001"] } }],
  },
};
