/**
 * Crash safety (issue 8): a write the server answered with success survives the process being
 * killed without warning (SIGKILL: no shutdown handler, no checkpoint, no close), and the database
 * opens cleanly afterwards (PostgreSQL crash recovery replays the WAL).
 * Sources: ISO/IEC 17025:2017 §7.5 and §8.4 (records are retained and protected); PostgreSQL 17
 * documentation §28 "Reliability and the Write-Ahead Log" and §19.5 (synchronous_commit).
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { openDatabase } from '../../../server/db/client';
import { verifyAuditChain } from '../../../server/audit';
import { signInCookie, startChildServer, type ChildServer } from './child-server';

const ADMIN = 'admin@emberline-demo.test';

/** Creates customers from `workers` parallel loops until stopped; returns the ids answered 201. */
function writeStream(server: ChildServer, cookie: string, label: string, workers = 3) {
  const acknowledged: Array<{ id: string; organisation: string }> = [];
  let stop = false;
  let n = 0;
  const loop = async () => {
    while (!stop) {
      const organisation = `${label} crash-test customer ${++n}`;
      try {
        const res = await fetch(`${server.url}/api/customers`, {
          method: 'POST',
          headers: { 'content-type': 'application/json', cookie },
          body: JSON.stringify({ organisation, address: 'Nowhere 1' }),
        });
        if (res.status !== 201) throw new Error(`unexpected ${res.status}: ${await res.text()}`);
        const body = (await res.json()) as { customer: { id: string } };
        acknowledged.push({ id: body.customer.id, organisation });
      } catch (err) {
        // After the kill a request fails with a socket error: its outcome is unknown, and it was
        // not acknowledged. Before the kill every write must succeed.
        if (!stop && !server.killing) throw err;
        return;
      }
    }
  };
  const done = Promise.all(Array.from({ length: workers }, loop));
  return {
    acknowledged,
    stop() {
      stop = true;
      return done;
    },
    done,
  };
}

describe('crash safety of the embedded database', () => {
  const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'emberline-crash-'));
  let server: ChildServer | null = null;
  afterAll(async () => {
    await server?.kill('SIGKILL');
    fs.rmSync(dataDir, { recursive: true, force: true });
  });

  it('when the server is SIGKILLed in the middle of a stream of writes, then every acknowledged write is there after a restart and the database opens cleanly', async () => {
    const acknowledged: Array<{ id: string; organisation: string }> = [];
    for (const round of ['first']) {
      server = await startChildServer({ dataDir });
      const cookie = await signInCookie(server.url, ADMIN);
      const stream = writeStream(server, cookie, round);
      // Kill once a good number of writes were acknowledged, while others are in flight.
      while (stream.acknowledged.length < 60) {
        await Promise.race([stream.done, new Promise((r) => setTimeout(r, 10))]);
      }
      const exit = await server.kill('SIGKILL');
      await stream.stop();
      expect(exit.signal).toBe('SIGKILL');
      acknowledged.push(...stream.acknowledged);
    }

    server = await startChildServer({ dataDir });
    const cookie = await signInCookie(server.url, ADMIN);
    const res = await fetch(`${server.url}/api/customers`, { headers: { cookie } });
    expect(res.status).toBe(200);
    const { customers } = (await res.json()) as { customers: Array<{ id: string; organisation: string }> };
    const byId = new Map(customers.map((c) => [c.id, c.organisation]));
    const missing = acknowledged.filter((a) => byId.get(a.id) !== a.organisation);
    expect(missing).toEqual([]);
    expect(acknowledged.length).toBeGreaterThanOrEqual(60);
    const stopped = await server.kill('SIGTERM');
    expect(stopped.code).toBe(0);
    server = null;

    // Opened directly: the settings that make a commit durable, and the audit trail intact with
    // one 'create' row for each acknowledged customer (written in the same transaction).
    const database = await openDatabase({ dataDir });
    try {
      const [sc] = await database.query<{ synchronous_commit: string }>('show synchronous_commit');
      expect(sc.synchronous_commit).toBe('on');
      const chain = await verifyAuditChain(database.db);
      expect(chain.ok, chain.reason).toBe(true);
      const audited = await database.query<{ entity_id: string }>(`select entity_id from audit_log where entity = 'customer' and action = 'create'`);
      const auditedIds = new Set(audited.map((r) => r.entity_id));
      expect(acknowledged.filter((a) => !auditedIds.has(a.id))).toEqual([]);
    } finally {
      await database.close();
    }
  }, 300_000);
});
