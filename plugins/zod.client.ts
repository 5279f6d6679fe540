import { z } from 'zod'

// The pages run under a Content Security Policy without 'unsafe-eval'. zod compiles fast object
// parsers with `new Function` where it may, and its probe for that is reported as a violation even
// though zod catches the refusal: in the browser, parse without compiling (the server still does).
// zod decides when a schema is built, and the router may load a page's schemas before plugins are
// set up, so this runs when the module loads (plugin modules load before any page code).
z.config({ jitless: true })

export default defineNuxtPlugin({ name: 'zod-jitless', setup() {} })
