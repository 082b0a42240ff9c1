/**
 * Graceful shutdown of the real server process (backend/src/server.ts): on SIGTERM or SIGINT it
 * stops accepting connections, lets a request already in flight finish, closes the database and
 * exits with code 0. The request is made slow on purpose: its body is sent in two halves, and the
 * signal arrives between them, so the server is certainly in the middle of it.
 */
import { request as httpRequest } from 'node:http';
import { describe, expect, it } from 'vitest';
import { openHttpSession } from '../helpers/http-session';
import { startServer } from './harness';

function exitCodeOf(child: import('node:child_process').ChildProcess): Promise<number | null> {
  if (child.exitCode !== null) return Promise.resolve(child.exitCode);
  return new Promise((resolve) => child.once('exit', (code) => resolve(code)));
}

/** Whether a new TCP connection to the server is refused. */
async function refusesNewConnections(url: string): Promise<boolean> {
  try {
    await fetch(`${url}/api/health`, { signal: AbortSignal.timeout(2000) });
    return false;
  } catch {
    return true;
  }
}

describe('graceful shutdown', () => {
  it('on SIGTERM a request in flight is answered, new connections are refused, and the process exits 0', async () => {
    const server = await startServer({ requireClient: false, env: { SEED_DEMO: 'false' } });
    try {
      const session = await openHttpSession(server.url);
      const body = JSON.stringify({ email: 'nobody.at.all@ridgeback.example' });
      const half = Math.floor(body.length / 2);
      const { port } = new URL(server.url);
      const answer = new Promise<{ status: number; text: string }>((resolve, reject) => {
        const call = httpRequest(
          {
            host: '127.0.0.1',
            port,
            method: 'POST',
            path: '/api/auth/forgot-password',
            headers: { ...session.headers(), 'content-type': 'application/json', 'content-length': Buffer.byteLength(body) },
          },
          (response) => {
            let text = '';
            response.on('data', (chunk: Buffer) => (text += chunk.toString()));
            response.on('end', () => resolve({ status: response.statusCode ?? 0, text }));
          },
        );
        call.on('error', reject);
        call.write(body.slice(0, half));
        // The second half follows the signal.
        setTimeout(() => {
          server.child.kill('SIGTERM');
          setTimeout(async () => {
            try {
              expect(server.child.exitCode).toBeNull();
              expect(await refusesNewConnections(server.url)).toBe(true);
              call.end(body.slice(half));
            } catch (error) {
              reject(error as Error);
            }
          }, 500);
        }, 300);
      });
      const finished = await answer;
      expect(finished.status, finished.text).toBe(202);
      expect(await exitCodeOf(server.child)).toBe(0);
      expect(server.output()).toContain('SIGTERM: shutting down');
      expect(server.output()).toContain('Stopped.');
    } finally {
      await server.stop();
    }
  });

  it('on SIGINT an idle server closes the database and exits 0', async () => {
    const server = await startServer({ requireClient: false, env: { SEED_DEMO: 'false' } });
    try {
      // A keep-alive connection left open by an earlier request must not hold the shutdown up.
      await (await fetch(`${server.url}/api/health`, { headers: { connection: 'keep-alive' } })).json();
      server.child.kill('SIGINT');
      // Exit code 0, not the 1 of the 10-second forced exit: the idle connection did not hold it up.
      expect(await exitCodeOf(server.child)).toBe(0);
      expect(server.output()).toContain('Stopped.');
    } finally {
      await server.stop();
    }
  });
});
