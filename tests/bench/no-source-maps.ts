// Imported after tsx by `npm run bench:api -- --source-maps=off`: the server's stack traces then name the compiled
// lines, not the sources. Measures what source-mapping costs, as SQLite's query reads a stack trace on every query.
process.setSourceMapsEnabled(false)
