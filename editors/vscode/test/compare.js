// Tokenises every bundled sheet with the editors' own engine (vscode-textmate
// on Oniguruma) and compares the scope of every UTF-16 unit with what the
// Go grammar test's engine gives (engine/lsp, TestGrammarTokens writes it).
// .ci/run runs it where npm can install the two packages:
//   node compare.js GRAMMAR.json SHEETS_DIR GO_TOKENS.json
const fs = require("fs");
const path = require("path");
const vsctm = require("vscode-textmate");
const oniguruma = require("vscode-oniguruma");

const [grammarPath, sheetsDir, goTokens] = process.argv.slice(2);
const wasm = fs.readFileSync(require.resolve("vscode-oniguruma/release/onig.wasm")).buffer;
const onigLib = oniguruma.loadWASM(wasm).then(() => ({
  createOnigScanner: (p) => new oniguruma.OnigScanner(p),
  createOnigString: (s) => new oniguruma.OnigString(s),
}));
const registry = new vsctm.Registry({
  onigLib,
  loadGrammar: async () => vsctm.parseRawGrammar(fs.readFileSync(grammarPath, "utf8"), grammarPath),
});
const want = JSON.parse(fs.readFileSync(goTokens, "utf8"));

registry.loadGrammar("source.sheaf").then((g) => {
  let diffs = 0;
  let units = 0;
  for (const f of fs.readdirSync(sheetsDir).filter((n) => n.endsWith(".sheaf")).sort()) {
    const lines = fs.readFileSync(path.join(sheetsDir, f), "utf8").split("\n");
    let rule = vsctm.INITIAL;
    lines.forEach((ln, li) => {
      const r = g.tokenizeLine(ln, rule);
      rule = r.ruleStack;
      const row = [];
      for (const t of r.tokens) {
        for (let i = t.startIndex; i < t.endIndex; i++) row[i] = t.scopes.join(" ");
      }
      const w = (want[f] || [])[li] || [];
      for (let i = 0; i < ln.length; i++) {
        units++;
        if (row[i] !== w[i]) {
          if (diffs++ < 20) console.log(`${f}:${li + 1}:${i + 1}: Oniguruma [${row[i]}], Go [${w[i]}]: ${ln}`);
        }
      }
    });
  }
  console.log(`grammar: ${units - diffs} of ${units} UTF-16 units scoped alike by Oniguruma and Go`);
  process.exit(diffs === 0 && units > 0 ? 0 : 1);
});
