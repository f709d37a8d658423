// Preloaded by scripts/serve-app.sh (node --require): the request guard of scripts/serve-guard.cjs in front of
// the web server.
require("./serve-guard.cjs").install();
