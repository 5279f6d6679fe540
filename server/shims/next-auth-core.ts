import { createRequire } from 'node:module'
import { dirname, join } from 'node:path'

// next-auth 4.24 no longer lists `next-auth/core` in its package exports, but the auth module
// imports AuthHandler from it. Load that file by path at run time from the installed package
// (nuxt.config.ts traces the file into the build). Resolved from the server's entry script, as
// the bundler rewrites import.meta.url inside the server bundle.
const require = createRequire(process.argv[1] ?? `${process.cwd()}/`)
const jwtEntry = require.resolve('next-auth/jwt')
const core = require(join(dirname(jwtEntry), '..', 'core', 'index.js')) as { AuthHandler: (params: { req: unknown, options: unknown }) => Promise<unknown> }

export const AuthHandler = core.AuthHandler
