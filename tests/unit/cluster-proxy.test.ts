import { Agent, createServer, get, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterEach, describe, expect, it } from 'vitest';
import { startProxy, type Proxy } from '../../server/dev/cluster';
import { freePort } from '../setup/ports';

/** A backend that answers every request with its own name. */
async function backend(name: string) {
  const server: Server = createServer((req, res) => {
    req.resume();
    req.on('end', () => res.end(name));
  });
  let connections = 0;
  server.on('connection', () => (connections += 1));
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', () => resolve()));
  return { id: name, connections: () => connections, url: `http://127.0.0.1:${(server.address() as AddressInfo).port}`, close: () => new Promise<void>((resolve) => server.close(() => resolve())) };
}

const open: Array<{ close: () => Promise<void> }> = [];
afterEach(async () => {
  for (const one of open.splice(0).reverse()) await one.close();
});

async function proxyOver(targets: Array<{ id: string; url: string }>): Promise<Proxy> {
  const proxy = await startProxy();
  open.push(proxy);
  for (const target of targets) proxy.add(target);
  return proxy;
}

/** An address where nothing listens: an instance that stopped answering. */
const gone = async () => ({ id: 'gone', url: `http://127.0.0.1:${await freePort()}` });

describe('the cluster proxy', () => {
  it('when instances answer, then requests go to each in turn', async () => {
    const [a, b] = await Promise.all([backend('a'), backend('b')]);
    open.push(a, b);
    const proxy = await proxyOver([a, b]);
    const names = [];
    for (let turn = 0; turn < 4; turn += 1) names.push(await (await fetch(`${proxy.url}/api/health`)).text());
    expect(names).toEqual(['a', 'b', 'a', 'b']);
    expect(Object.fromEntries(proxy.served)).toEqual({ a: 2, b: 2 });
  });

  it('when an instance does not answer, then a GET goes on to the next and a POST gets 502 in the app’s error shape', async () => {
    const a = await backend('a');
    open.push(a);
    const proxy = await proxyOver([await gone(), a]);
    const read = await fetch(`${proxy.url}/api/jobs`);
    expect(read.status).toBe(200);
    expect(await read.text()).toBe('a');

    const proxyToGone = await proxyOver([await gone(), a]);
    const write = await fetch(`${proxyToGone.url}/api/jobs`, { method: 'POST', body: '{}', headers: { 'Content-Type': 'application/json' } });
    expect(write.status).toBe(502);
    expect(await write.json()).toEqual({ error: { code: 'bad_gateway', message: expect.any(String) } });
    // The one that did not answer is passed over for a while: the next POST reaches a live one.
    expect(await (await fetch(`${proxyToGone.url}/api/jobs`, { method: 'POST', body: '{}' })).text()).toBe('a');
  });

  it('when a client sends requests one after another, then its connection and the connection to the instance are kept open', async () => {
    const a = await backend('a');
    open.push(a);
    const proxy = await proxyOver([a]);
    const agent = new Agent({ keepAlive: true, maxSockets: 1 });
    const answers: Array<string | undefined> = [];
    for (let turn = 0; turn < 4; turn += 1) {
      answers.push(
        await new Promise<string | undefined>((resolve, reject) =>
          get(`${proxy.url}/api/health`, { agent }, (res) => {
            res.resume();
            res.on('end', () => resolve(res.headers.connection));
          }).on('error', reject),
        ),
      );
    }
    agent.destroy();
    // Without keep-alive each answer says "close": the client connects again for every request (and under load
    // requests already sent on a closing connection are sent again), and the proxy opens a connection per request.
    expect(answers).toEqual(['keep-alive', 'keep-alive', 'keep-alive', 'keep-alive']);
    expect(a.connections()).toBe(1);
  });

  it('when no instance answers, then 502', async () => {
    const proxy = await proxyOver([await gone()]);
    const res = await fetch(`${proxy.url}/api/health`);
    expect(res.status).toBe(502);
    expect((await res.json()).error.code).toBe('bad_gateway');
  });

  it('when a socket.io client polls, then its cookie keeps it on the instance that answered it first', async () => {
    const [a, b] = await Promise.all([backend('a'), backend('b')]);
    open.push(a, b);
    const proxy = await proxyOver([a, b]);
    const first = await fetch(`${proxy.url}/socket.io/?EIO=4&transport=polling`);
    const cookie = first.headers.get('set-cookie')!.split(';')[0];
    expect(cookie).toBe(`tenthmark_instance=${await first.text()}`);
    const held = cookie.endsWith('=a') ? 'a' : 'b';
    for (let turn = 0; turn < 3; turn += 1) {
      const again = await fetch(`${proxy.url}/socket.io/?EIO=4&transport=polling&sid=x`, { headers: { cookie } });
      expect(await again.text()).toBe(held);
      expect(again.headers.get('set-cookie')).toBeNull();
    }
  });
});
