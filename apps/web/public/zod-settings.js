// The page's CSP allows no eval, so zod must not probe for it: each probe is a CSP violation
// report. zod reads its settings from this global when it loads, and builds its schemas (probing
// unless told not to) as the shared contracts load, before any code of the app runs; so this is a
// classic script of its own, run before the app's module scripts.
globalThis.__zod_globalConfig = Object.assign(globalThis.__zod_globalConfig || {}, {
  jitless: true,
});
