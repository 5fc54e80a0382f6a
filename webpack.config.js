/**
 * Build of the Airtally add-in (webpack 5 + ts-loader).
 *
 * - `functions.js`: the custom functions; the metadata plugin writes
 *   `functions.json` from the JSDoc tags and appends the registration calls.
 *   It must load in a bare JavaScript context with only `CustomFunctions`.
 * - `taskpane.html` / `taskpane.js`: the pane, which is also the shared
 *   runtime page that loads `functions.js`.
 * - `manifest.xml`, icons: copied. In a production build every
 *   https://localhost:3000/ URL (manifest and functions.json help links) is
 *   rewritten to AIRTALLY_HOST when that variable is set.
 */
const path = require("path");
const CustomFunctionsMetadataPlugin = require("custom-functions-metadata-plugin");
const HtmlWebpackPlugin = require("html-webpack-plugin");
const CopyWebpackPlugin = require("copy-webpack-plugin");
const { sources, Compilation } = require("webpack");
const { HelpPagesPlugin } = require("./scripts/help-pages");

const DEV_ORIGIN = "https://localhost:3000/";

/** The origin the built add-in is served from (must end with a slash). */
function hostOrigin(mode) {
  const host = process.env.AIRTALLY_HOST;
  if (mode !== "production" || !host) return DEV_ORIGIN;
  if (!/^https:\/\//.test(host)) throw new Error(`AIRTALLY_HOST must be an https:// URL, got ${host}`);
  return host.endsWith("/") ? host : host + "/";
}

/** Rewrites the dev origin inside emitted text assets (functions.json, help pages). */
class RewriteOriginPlugin {
  constructor(origin, pattern) {
    this.origin = origin;
    this.pattern = pattern;
  }
  apply(compiler) {
    if (this.origin === DEV_ORIGIN) return;
    compiler.hooks.thisCompilation.tap("RewriteOriginPlugin", (compilation) => {
      compilation.hooks.processAssets.tap(
        { name: "RewriteOriginPlugin", stage: Compilation.PROCESS_ASSETS_STAGE_OPTIMIZE_INLINE },
        (assets) => {
          for (const name of Object.keys(assets)) {
            if (!this.pattern.test(name)) continue;
            const text = assets[name].source().toString();
            compilation.updateAsset(name, new sources.RawSource(text.split(DEV_ORIGIN).join(this.origin)));
          }
        },
      );
    });
  }
}

module.exports = (env, argv) => {
  const mode = argv.mode || "production";
  const origin = hostOrigin(mode);
  const tsRule = (file, configFile) => ({
    test: file,
    exclude: /node_modules/,
    use: {
      loader: "ts-loader",
      // Each entry gets its own ts-loader instance so a watch build of one never type-checks the other's globals.
      options: { instance: configFile, onlyCompileBundledFiles: true, compilerOptions: { sourceMap: mode !== "production" } },
    },
  });
  return {
    mode,
    devtool: mode === "production" ? false : "source-map",
    target: ["web", "es2019"],
    entry: {
      functions: "./src/functions/functions.ts",
      taskpane: "./src/taskpane/taskpane.ts",
    },
    output: {
      // AIRTALLY_OUT builds elsewhere (the hosting test builds into a temporary folder).
      path: path.resolve(__dirname, process.env.AIRTALLY_OUT || "dist"),
      filename: "[name].js",
      clean: true,
    },
    resolve: { extensions: [".ts", ".js"] },
    module: {
      rules: [tsRule(/src[\\/]functions[\\/].*\.ts$|src[\\/]core[\\/].*\.ts$/, "functions"), tsRule(/src[\\/]taskpane[\\/].*\.ts$/, "taskpane")],
    },
    performance: { hints: false },
    optimization: {
      // webpack's default terser settings, less `reduce_funcs`: terser would paste every single-use
      // function into its caller as an immediately called function expression, which makes the
      // add-in's hot paths too large for V8 to inline and re-creates a closure per call (terser's
      // README: "Disabling this option sometimes improves performance"). `npm run bench` shows
      // the difference: MPDU and RADIOS through the bundle run at about 0.9× instead of 0.35–0.65×
      // of their inline baselines, for 0.9 KB more gzip.
      minimizeOptions: { javascript: { compress: { passes: 2, reduce_funcs: false } } },
    },
    plugins: [
      new CustomFunctionsMetadataPlugin({ output: "functions.json", input: "./src/functions/functions.ts" }),
      new HtmlWebpackPlugin({
        filename: "taskpane.html",
        template: "./src/taskpane/taskpane.html",
        chunks: ["functions", "taskpane"],
        chunksSortMode: "manual",
        scriptLoading: "blocking",
        inject: "body",
      }),
      new CopyWebpackPlugin({
        patterns: [
          { from: "assets/*.png", to: "assets/[name][ext]" },
          {
            from: "manifest.xml",
            to: "manifest.xml",
            // URLs first, then the bare origin (AppDomain) to the host's scheme and authority.
            transform: (content) =>
              content.toString().split(DEV_ORIGIN).join(origin).split(DEV_ORIGIN.slice(0, -1)).join(new URL(origin).origin),
          },
        ],
      }),
      new HelpPagesPlugin({ input: "./src/functions/functions.ts" }),
      new RewriteOriginPlugin(origin, /\.(json|html|js)$/),
    ],
  };
};
