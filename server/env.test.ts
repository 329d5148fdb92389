import { describe, expect, it } from 'vitest'
import { parseEnv } from './env'

const devSecret = () => 'd'.repeat(64)
const parse = (raw: Record<string, string | undefined>) => parseEnv(raw, { devSecret, clusterPasswordFile: '/nonexistent/pg-password' })

function errorsOf(raw: Record<string, string | undefined>): string[] {
  const r = parse(raw)
  if (r.ok) throw new Error('expected the configuration to be rejected')
  return r.errors
}

describe('parseEnv', () => {
  it('fills defaults for an empty environment', () => {
    const r = parse({})

    expect(r.ok).toBe(true)
    if (!r.ok) return
    expect(r.config).toMatchObject({
      nodeEnv: 'development',
      databaseUrl: 'postgres://postgres@127.0.0.1:55433/sonoweave',
      port: 3001,
      host: '127.0.0.1',
      jwtSecret: 'd'.repeat(64),
      workerCount: 1,
      embeddedWorker: false,
      smtpUrl: undefined,
    })
    expect(r.config.dataDir).toMatch(/\/\.data$/)
  })

  it('follows PGPORT for the local cluster and parses the given values', () => {
    const r = parse({ PGPORT: '55499', PORT: '8080', WORKER_COUNT: '3', EMBEDDED_WORKER: 'true', SMTP_URL: 'smtp://mail.halden-lab.example:25' })

    expect(r.ok && r.config).toMatchObject({
      databaseUrl: 'postgres://postgres@127.0.0.1:55499/sonoweave',
      port: 8080,
      workerCount: 3,
      embeddedWorker: true,
      smtpUrl: 'smtp://mail.halden-lab.example:25',
    })
  })

  it('accepts SMTP_URL=catcher and a PUBLIC_URL without its trailing slash, and rejects a PUBLIC_URL without a scheme', () => {
    const ok = parse({ SMTP_URL: 'catcher', PUBLIC_URL: 'https://sonoweave.halden-lab.example/' })
    expect(ok.ok && ok.config).toMatchObject({ smtpUrl: 'catcher', publicUrl: 'https://sonoweave.halden-lab.example' })

    const bad = parse({ PUBLIC_URL: 'sonoweave.halden-lab.example' })
    expect(bad.ok).toBe(false)
    expect(!bad.ok && bad.errors.join('\n')).toMatch(/^PUBLIC_URL: /m)
  })

  it('rejects a malformed DATABASE_URL with a message naming the variable and the expected form', () => {
    for (const bad of ['localhost:5432/app', 'mysql://u@h/db', 'postgres://host-without-db']) {
      const errors = errorsOf({ DATABASE_URL: bad })
      expect(errors).toHaveLength(1)
      expect(errors[0]).toMatch(/^DATABASE_URL: must look like postgres:\/\//)
    }
  })

  it('rejects a bad PORT, one line per bad variable', () => {
    expect(errorsOf({ PORT: 'eighty' })).toEqual(['PORT: must be a whole number between 1 and 65535'])
    expect(errorsOf({ PORT: '70000' })).toEqual(['PORT: must be between 1 and 65535'])
    const both = errorsOf({ PORT: '0', LOG_LEVEL: 'loud' })
    expect(both.map((e) => e.split(':')[0]).sort()).toEqual(['LOG_LEVEL', 'PORT'])
  })

  it('treats an empty variable as unset', () => {
    const r = parse({ PORT: '', DATABASE_URL: '' })
    expect(r.ok && r.config.port).toBe(3001)
  })

  it('requires JWT_SECRET and DATABASE_URL in production, and a long enough secret anywhere', () => {
    const prod = errorsOf({ NODE_ENV: 'production' })
    expect(prod.map((e) => e.split(':')[0]).sort()).toEqual(['DATABASE_URL', 'JWT_SECRET'])
    expect(errorsOf({ JWT_SECRET: 'short' })[0]).toMatch(/^JWT_SECRET: must be at least 32 characters/)
  })

  it('rejects worker counts that are not small whole numbers and non-boolean flags', () => {
    expect(errorsOf({ WORKER_COUNT: '-1' })[0]).toMatch(/^WORKER_COUNT:/)
    expect(errorsOf({ WORKER_COUNT: '500' })[0]).toMatch(/^WORKER_COUNT:/)
    expect(errorsOf({ EMBEDDED_WORKER: 'maybe' })).toEqual(['EMBEDDED_WORKER: must be true or false'])
  })
})
