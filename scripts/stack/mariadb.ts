import { execFile } from 'node:child_process'
import { existsSync, mkdirSync } from 'node:fs'
import { join } from 'node:path'
import { promisify } from 'node:util'
import { isAlive, portOpen, readPid, runOrThrow, startService, waitFor, type Service } from './processes'
import { envPrefix, type Profile } from './profile'

const execFileAsync = promisify(execFile)

function binary(name: string): string {
  for (const dir of ['/usr/sbin', '/usr/bin', '/usr/local/sbin', '/usr/local/bin']) {
    if (existsSync(join(dir, name))) return join(dir, name)
  }
  return name
}

const mariadbPaths = (p: Profile) => ({
  datadir: join(p.dataDir, 'mariadb'),
  socket: join(p.dataDir, 'mysqld.sock'),
  pidFile: join(p.dataDir, 'mariadbd.pid'),
})

async function sql(p: Profile, statement: string): Promise<string> {
  const { stdout } = await execFileAsync(binary('mariadb'), ['--no-defaults', `--socket=${mariadbPaths(p).socket}`, '-uroot', '-N', '-e', statement])
  return stdout
}

async function answers(p: Profile): Promise<boolean> {
  try {
    await sql(p, 'SELECT 1')
    return true
  }
  catch {
    return false
  }
}

/**
 * Our own MariaDB server on loopback with a project-local data folder. Reuses one that already
 * serves this folder (then returns null: it is not ours to stop).
 */
export async function startMariadb(p: Profile, echo: boolean): Promise<Service | null> {
  const { datadir, socket, pidFile } = mariadbPaths(p)
  const errorLog = join(p.dataDir, 'logs', 'mariadb-error.log')
  const running = readPid(pidFile)
  if (running && isAlive(running) && await answers(p)) return null
  if (await portOpen(p.dbPort)) throw new Error(`Port ${p.dbPort} is taken by another program; set ${envPrefix(p.mode)}DB_PORT to a free port.`)
  if (!existsSync(join(datadir, 'mysql'))) {
    mkdirSync(datadir, { recursive: true })
    await runOrThrow(binary('mariadb-install-db'), ['--no-defaults', `--datadir=${datadir}`, '--user=root', '--skip-test-db', '--auth-root-authentication-method=socket'], { cwd: p.root, quiet: true })
  }
  const service = startService('mariadb', binary('mariadbd'), [
    '--no-defaults', `--datadir=${datadir}`, `--socket=${socket}`, `--pid-file=${pidFile}`,
    `--port=${p.dbPort}`, '--bind-address=127.0.0.1', '--user=root', '--skip-name-resolve',
    '--character-set-server=utf8mb4', '--collation-server=utf8mb4_unicode_ci',
    '--innodb-buffer-pool-size=128M', '--max-connections=200', `--log-error=${errorLog}`,
  ], { cwd: p.root, logDir: join(p.dataDir, 'logs'), echo })
  // The server writes its messages there, not to its console.
  service.logFile = errorLog
  await mariadbReady(p, service)
  return service
}

/** Resolves once the server (first started or restarted) answers on its socket. */
export function mariadbReady(p: Profile, service: Service): Promise<void> {
  return waitFor('MariaDB', () => answers(p), 60_000, service.child)
}

/** Creates the app's database and user. The test and bench profiles get a new, empty database every run. */
export async function prepareDatabase(p: Profile): Promise<void> {
  const db = p.databaseName
  const statements = [
    p.mode !== 'start' ? `DROP DATABASE IF EXISTS \`${db}\`` : '',
    `CREATE DATABASE IF NOT EXISTS \`${db}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`,
    `CREATE USER IF NOT EXISTS 'pomewright'@'127.0.0.1' IDENTIFIED BY 'pomewright'`,
    `CREATE USER IF NOT EXISTS 'pomewright'@'localhost' IDENTIFIED BY 'pomewright'`,
    // The test suite also creates scratch databases named pomewright_… (migration up/down checks).
    `GRANT ALL PRIVILEGES ON \`pomewright%\`.* TO 'pomewright'@'127.0.0.1'`,
    `GRANT ALL PRIVILEGES ON \`pomewright%\`.* TO 'pomewright'@'localhost'`,
  ].filter(Boolean)
  await sql(p, statements.join('; '))
}
