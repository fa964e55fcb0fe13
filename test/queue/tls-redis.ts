/**
 * A throw-away Redis that speaks TLS only, for the rediss:// tests: openssl (Debian's) makes a certificate authority
 * and a server certificate for 127.0.0.1 in a temporary folder, plus a second, unrelated authority that a client may
 * wrongly trust; redis-server listens with `--port 0 --tls-port P` on a free loopback port, persistence off.
 */
import { execFileSync, spawn } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { connect } from 'node:tls';
import { setTimeout as sleep } from 'node:timers/promises';
import { freePort, REDIS_SERVER, stopProcess, type TestRedis } from '../bench/redis-server.js';

export interface TestCertificates {
  folder: string;
  /** PEM file of the authority that signed the server's certificate */
  ca: string;
  /** PEM file of an authority that signed nothing Redis presents */
  otherCa: string;
  serverCert: string;
  serverKey: string;
  remove(): void;
}

function openssl(folder: string, args: string[]): void {
  execFileSync('openssl', args, { cwd: folder, stdio: ['ignore', 'ignore', 'pipe'] });
}

/** A CA, a server certificate for IP 127.0.0.1 and DNS localhost signed by it, and an unrelated CA (1 day each). */
export function makeCertificates(): TestCertificates {
  const folder = mkdtempSync(join(tmpdir(), 'gridshake-tls-'));
  const ca = (name: string, subject: string): void =>
    openssl(folder, ['req', '-x509', '-newkey', 'rsa:2048', '-nodes', '-keyout', `${name}.key`, '-out', `${name}.crt`, '-days', '1', '-subj', subject]);
  ca('ca', '/CN=gridshake test authority');
  ca('other-ca', '/CN=an unrelated test authority');
  openssl(folder, ['req', '-newkey', 'rsa:2048', '-nodes', '-keyout', 'server.key', '-out', 'server.csr', '-subj', '/CN=127.0.0.1']);
  writeFileSync(join(folder, 'server.ext'), 'subjectAltName=IP:127.0.0.1,DNS:localhost\n');
  openssl(folder, ['x509', '-req', '-in', 'server.csr', '-CA', 'ca.crt', '-CAkey', 'ca.key', '-CAcreateserial', '-out', 'server.crt', '-days', '1', '-extfile', 'server.ext']);
  return {
    folder,
    ca: join(folder, 'ca.crt'),
    otherCa: join(folder, 'other-ca.crt'),
    serverCert: join(folder, 'server.crt'),
    serverKey: join(folder, 'server.key'),
    remove: () => rmSync(folder, { recursive: true, force: true }),
  };
}

/** PING over TLS (trusting `ca`); resolves with the first reply line, or '' when nothing answers. */
function tlsPing(port: number, ca: string): Promise<string> {
  return new Promise((resolve) => {
    const socket = connect({ host: '127.0.0.1', port, ca: readFileSync(ca, 'utf8') }, () => socket.write('PING\r\n'));
    socket.setTimeout(2000, () => socket.destroy());
    socket.on('data', (data) => {
      socket.end();
      resolve(data.toString('utf8'));
    });
    socket.on('error', () => resolve(''));
    socket.on('close', () => resolve(''));
  });
}

/** Starts redis-server with TLS only (no plain port) and waits until it answers PING over TLS. `url` is rediss://. */
export async function startTlsRedis(certificates: TestCertificates): Promise<TestRedis> {
  const port = await freePort();
  const args = ['--port', '0', '--tls-port', String(port), '--bind', '127.0.0.1', '--save', '', '--appendonly', 'no', '--loglevel', 'warning',
    '--tls-cert-file', certificates.serverCert, '--tls-key-file', certificates.serverKey, '--tls-ca-cert-file', certificates.ca, '--tls-auth-clients', 'no'];
  const child = spawn(REDIS_SERVER, args, { stdio: ['ignore', 'ignore', 'pipe'] });
  let stderr = '';
  child.stderr?.on('data', (data: Buffer) => {
    stderr += data.toString('utf8');
  });
  const failed = new Promise<never>((_, reject) => {
    child.once('error', (error) => reject(new Error(`cannot start ${REDIS_SERVER}: ${error.message} (install Debian's redis-server)`)));
    child.once('exit', (code) => reject(new Error(`${REDIS_SERVER} with TLS exited with code ${code}: ${stderr}`)));
  });
  failed.catch(() => undefined);
  const deadline = Date.now() + 10_000;
  while (!(await Promise.race([tlsPing(port, certificates.ca), failed])).startsWith('+PONG')) {
    if (Date.now() > deadline) throw new Error(`redis-server with TLS on port ${port} did not answer within 10 s: ${stderr}`);
    await sleep(50);
  }
  return { port, url: `rediss://127.0.0.1:${port}/0`, process: child, stop: () => stopProcess(child) };
}
