import { describe, it, expect } from 'vitest';
import { runCli } from '../../server/cli/main.js';
import { bindWarning } from '../../server/cli/serve-command.js';
import { createHostPolicy, isAllowedHost, isAllowedOrigin, parseHostHeader } from '../../server/security/allowed-hosts.js';

function capture(): { io: { stdout: (text: string) => void; stderr: (text: string) => void }; out: () => string; err: () => string } {
  let out = '';
  let err = '';
  return { io: { stdout: (text) => (out += text), stderr: (text) => (err += text) }, out: () => out, err: () => err };
}

describe('gridshake serve options', () => {
  it('warns when binding to a non-loopback address, not for loopback', () => {
    expect(bindWarning('127.0.0.1')).toBeNull();
    expect(bindWarning('localhost')).toBeNull();
    expect(bindWarning('::1')).toBeNull();
    expect(bindWarning('0.0.0.0')).toContain('reachable from other computers');
    expect(bindWarning('192.168.1.20')).toContain('192.168.1.20');
  });

  it('lists its options in --help, with the defaults of the contract', async () => {
    const { io, out } = capture();
    expect(await runCli(['serve', '--help'], io)).toBe(0);
    expect(out()).toContain('gridshake serve [--host 127.0.0.1] [--port 5178] [--data DIR]');
    expect(out()).toContain('./.gridshake');
  });

  it('refuses a bad port (exit 1, coded message) and an unknown option (exit 2)', async () => {
    const bad = capture();
    expect(await runCli(['serve', '--port', '70000'], bad.io)).toBe(1);
    expect(bad.err()).toContain("--port must be a port from 0 to 65535, got '70000'");
    const unknown = capture();
    expect(await runCli(['serve', '--colour', 'red'], unknown.io)).toBe(2);
  });

  it('takes --basemap only as an http(s) XYZ template, refusing others in one line (exit 1) before starting', async () => {
    const help = capture();
    expect(await runCli(['serve', '--help'], help.io)).toBe(0);
    expect(help.out()).toContain('--basemap');
    const bad = capture();
    expect(await runCli(['serve', '--basemap', 'http://127.0.0.1:8080/tiles.png'], bad.io)).toBe(1);
    expect(bad.err()).toContain('--basemap "http://127.0.0.1:8080/tiles.png" has no {z}');
    expect(bad.err().trim().split('\n')).toHaveLength(1);
  });
});

describe('Host and Origin policy', () => {
  const listening = createHostPolicy('127.0.0.1', () => 5178);
  it('parses host headers with ports and IPv6 brackets', () => {
    expect(parseHostHeader('LocalHost:5178')).toEqual({ name: 'localhost', port: 5178 });
    expect(parseHostHeader('[::1]:80')).toEqual({ name: '[::1]', port: 80 });
    expect(parseHostHeader('a b')).toBeNull();
  });
  it('accepts loopback names on the listening port only', () => {
    expect(isAllowedHost(listening, '127.0.0.1:5178')).toBe(true);
    expect(isAllowedHost(listening, 'localhost:5178')).toBe(true);
    expect(isAllowedHost(listening, 'localhost:5179')).toBe(false);
    expect(isAllowedHost(listening, 'localhost')).toBe(false);
    expect(isAllowedHost(listening, '127.0.0.1.nip.example:5178')).toBe(false);
    expect(isAllowedHost(listening, undefined)).toBe(false);
  });
  it('accepts the bound address when it is not loopback, and never 0.0.0.0 itself', () => {
    const lan = createHostPolicy('192.168.1.20', () => 5178);
    expect(isAllowedHost(lan, '192.168.1.20:5178')).toBe(true);
    const any = createHostPolicy('0.0.0.0', () => 5178);
    expect(isAllowedHost(any, '0.0.0.0:5178')).toBe(false);
  });
  it('accepts only its own http origin', () => {
    expect(isAllowedOrigin(listening, 'http://127.0.0.1:5178')).toBe(true);
    expect(isAllowedOrigin(listening, 'https://127.0.0.1:5178')).toBe(false);
    expect(isAllowedOrigin(listening, 'http://evil.example:5178')).toBe(false);
    expect(isAllowedOrigin(listening, 'null')).toBe(false);
  });
});
