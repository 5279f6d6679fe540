import { spawn } from 'node:child_process'
import { createReadStream, mkdtempSync, openSync, closeSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { Readable } from 'node:stream'
import { pipeline } from 'node:stream/promises'
import { createInterface } from 'node:readline'
import type { DatabaseAddress } from '../../server/db/config'

export const quoteName = (name: string) => `\`${name.replaceAll('`', '``')}\``

/**
 * Runs a MariaDB client program with the address in a private option file, so the password is
 * never on a command line (where `ps` shows it). TCP always, as the app connects: the client
 * would otherwise take `localhost` to mean a socket.
 */
async function runClient(program: string, args: string[], a: DatabaseAddress, io: { stdin?: Readable, stdoutFile?: string }): Promise<void> {
  const dir = mkdtempSync(join(tmpdir(), 'pomewright-db-'))
  const optionFile = join(dir, 'client.cnf')
  const value = (v: string) => `"${v.replaceAll('\\', '\\\\').replaceAll('"', '\\"')}"`
  writeFileSync(optionFile, `[client]\nprotocol=tcp\nhost=${value(a.host)}\nport=${a.port}\nuser=${value(a.user)}\npassword=${value(a.password)}\n`, { mode: 0o600 })
  const out = io.stdoutFile ? openSync(io.stdoutFile, 'w') : 'ignore'
  try {
    const child = spawn(program, [`--defaults-file=${optionFile}`, ...args], { stdio: [io.stdin ? 'pipe' : 'ignore', out, 'pipe'] })
    let stderr = ''
    child.stderr!.on('data', (chunk: Buffer) => {
      stderr += chunk.toString()
    })
    const exited = new Promise<number>((resolve, reject) => {
      child.once('error', reject)
      child.once('close', code => resolve(code ?? 1))
    })
    // A client that stops reading (it failed) ends the feed with EPIPE: then its own exit says why.
    const fed = io.stdin ? pipeline(io.stdin, child.stdin!).then(() => null, (error: Error) => error) : null
    const code = await exited
    const feedError = await fed
    if (code !== 0) throw new Error(`${program} failed (exit code ${code}): ${stderr.trim() || 'no message'}`)
    if (feedError) throw feedError
  }
  catch (error) {
    if ((error as NodeJS.ErrnoException).code === 'ENOENT') throw new Error(`${program} is not installed: it comes with Debian's mariadb-client package.`)
    throw error
  }
  finally {
    if (typeof out === 'number') closeSync(out)
    rmSync(dir, { recursive: true, force: true })
  }
}

/**
 * One consistent snapshot of the database (InnoDB, one transaction), with its stored routines and
 * triggers. Binary columns are written as hex so the file is plain text. Written without
 * `CREATE DATABASE`, so it loads into whatever database the restoring stack uses.
 */
export function dumpDatabase(a: DatabaseAddress, file: string): Promise<void> {
  return runClient('mariadb-dump', ['--single-transaction', '--routines', '--triggers', '--hex-blob', '--default-character-set=utf8mb4', a.database], a, { stdoutFile: file })
}

/** Drops the database, creates it afresh and loads the dump into it, in one client session. */
export function loadDatabase(a: DatabaseAddress, file: string, charset: { characterSet: string, collation: string }): Promise<void> {
  if (!/^\w+$/.test(charset.characterSet) || !/^\w+$/.test(charset.collation)) throw new Error(`Not a character set and collation: ${charset.characterSet} ${charset.collation}`)
  const db = quoteName(a.database)
  const prelude = `DROP DATABASE IF EXISTS ${db};\nCREATE DATABASE ${db} CHARACTER SET ${charset.characterSet} COLLATE ${charset.collation};\nUSE ${db};\n`
  const feed = Readable.from((async function* () {
    yield Buffer.from(prelude)
    yield* createReadStream(file)
  })())
  return runClient('mariadb', ['--batch'], a, { stdin: feed })
}

const CREATE_TABLE = /^CREATE TABLE `((?:[^`]|``)+)` \(/
const INSERT = /^INSERT INTO `((?:[^`]|``)+)` VALUES/

/**
 * Every table in a dump with its row count. An `INSERT … VALUES (…),(…);` statement may run over
 * several lines (one tuple a line since MariaDB 10.11's mariadb-dump); its rows are its top-level
 * parentheses outside single-quoted strings, in which a backslash escapes the next character and
 * a line break is always escaped. Routine and trigger bodies (between `DELIMITER ;;` and
 * `DELIMITER ;`) are not data.
 */
export async function countRows(lines: AsyncIterable<string> | Iterable<string>): Promise<Record<string, number>> {
  const tables: Record<string, number> = {}
  let inBody = false
  let table: string | null = null
  let depth = 0
  for await (const line of lines) {
    let start = 0
    if (table === null) {
      if (line.startsWith('DELIMITER ')) {
        inBody = line.trim() !== 'DELIMITER ;'
        continue
      }
      if (inBody) continue
      const created = CREATE_TABLE.exec(line)
      if (created) {
        tables[created[1]!.replaceAll('``', '`')] = 0
        continue
      }
      const insert = INSERT.exec(line)
      if (!insert) continue
      table = insert[1]!.replaceAll('``', '`')
      tables[table] ??= 0
      start = insert[0].length
      depth = 0
    }
    let inString = false
    for (let i = start; i < line.length; i++) {
      const c = line[i]
      if (inString) {
        if (c === '\\') i++
        else if (c === '\'') inString = false
      }
      else if (c === '\'') inString = true
      else if (c === '(') {
        if (depth === 0) tables[table]!++
        depth++
      }
      else if (c === ')') depth--
      else if (c === ';' && depth === 0) {
        table = null
        break
      }
    }
  }
  return tables
}

/**
 * Every table in the dump file with its row count, read from the dump itself, so the counts are of
 * the same snapshot (a count taken beside the dump would see writes made meanwhile).
 */
export function rowsInDump(file: string): Promise<Record<string, number>> {
  return countRows(createInterface({ input: createReadStream(file, 'utf8'), crlfDelay: Infinity }))
}
