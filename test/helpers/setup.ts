// Shared Vitest setup: block every non-loopback network request made through fetch.
// Rule of the project: tests run offline.
const realFetch = globalThis.fetch;
globalThis.fetch = async (input: string | URL | Request, init?: RequestInit): Promise<Response> => {
  const url = new URL(typeof input === 'string' ? input : input instanceof URL ? input.href : input.url);
  if (!['127.0.0.1', 'localhost', '[::1]'].includes(url.hostname)) {
    throw new Error(`test network guard: refused non-loopback request to ${url.hostname}`);
  }
  return realFetch(input, init);
};
