import { knexConfig } from './server/db/config'

// Used by the Knex CLI: node --import tsx node_modules/knex/bin/cli.js --knexfile knexfile.ts migrate:latest
export default knexConfig()
