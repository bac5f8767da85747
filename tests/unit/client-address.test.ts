import { describe, expect, it } from 'vitest';
import { clientAddress, servedOverHttps } from '@/lib/client-address';

// MDN, "X-Forwarded-For": each proxy appends the address it received the request from, so the
// left-most entries may be forged by the client and the trustworthy one is counted from the right,
// as many entries as there are trusted proxies. nginx documents $proxy_add_x_forwarded_for as the
// incoming header "with the $remote_addr variable appended to it, separated by a comma".
describe('the client address of a request', () => {
  it('takes the entry the nearest trusted proxy appended, not what the client wrote', () => {
    // The client claims 10.0.0.1; the one proxy in front saw 203.0.113.7.
    expect(clientAddress(new Headers({ 'x-forwarded-for': '10.0.0.1, 203.0.113.7' }), 1)).toBe('203.0.113.7');
    // Behind a CDN and a load balancer, two entries from the right.
    expect(clientAddress(new Headers({ 'x-forwarded-for': '10.0.0.1, 198.51.100.4, 192.0.2.9' }), 2)).toBe('198.51.100.4');
  });

  it('reads plain header objects, repeated headers and short or missing headers', () => {
    // With no proxy (0) proxy.ts has removed what the client wrote; the one entry is the socket's, from Next.js.
    expect(clientAddress({ 'x-forwarded-for': '203.0.113.7' }, 0)).toBe('203.0.113.7');
    expect(clientAddress({ 'x-forwarded-for': ['10.0.0.1', '203.0.113.7'] })).toBe('203.0.113.7');
    // Fewer entries than proxies: the left-most is all there is.
    expect(clientAddress(new Headers({ 'x-forwarded-for': '203.0.113.7' }), 3)).toBe('203.0.113.7');
    expect(clientAddress(new Headers({ 'x-forwarded-for': ' , ' }))).toBe('unknown');
    expect(clientAddress(new Headers())).toBe('unknown');
    expect(clientAddress(undefined)).toBe('unknown');
  });
});

// RFC 6797 §7.2: HSTS is sent only over secure transport. The app itself speaks plain HTTP, so it
// learns of https from its own public URL or from a proxy it was told to trust.
describe('whether a request was served over https', () => {
  const proto = (value: string) => new Headers({ 'x-forwarded-proto': value });
  it('believes the public URL, and x-forwarded-proto only from a configured proxy', () => {
    expect(servedOverHttps('https://vines.example.com', new Headers(), 0)).toBe(true);
    expect(servedOverHttps('http://localhost:3000', proto('https'), 0)).toBe(false);
    expect(servedOverHttps('http://localhost:3000', proto('https'), 1)).toBe(true);
    expect(servedOverHttps('http://localhost:3000', proto('http'), 1)).toBe(false);
    // Two proxies that append: the outer one (TLS) saw https, whatever the client wrote first.
    expect(servedOverHttps('http://localhost:3000', proto('http, https, http'), 2)).toBe(true);
    expect(servedOverHttps(undefined, new Headers(), 1)).toBe(false);
  });
});
