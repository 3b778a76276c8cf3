/**
 * A request held in flight on purpose, for tests of a clean stop: its headers are in (the
 * server has taken it in and answered `100 Continue`), its body is not, so it stays open until
 * the test finishes it. No sleeps: the 100 Continue is the server's own word that it has it.
 */
import http from 'node:http';

export interface HeldRequest {
  /** Sends the rest of the body and resolves with the answer (rejects if the connection is cut). */
  finish(): Promise<{ status: number; code?: string }>;
}

/** Starts `POST url` with a JSON body and holds it after its first bytes. */
export async function holdRequest(
  url: string,
  body: unknown,
  headers: Record<string, string> = {},
): Promise<HeldRequest> {
  const text = JSON.stringify(body);
  const req = http.request(url, {
    method: 'POST',
    agent: false,
    headers: {
      ...headers,
      'content-type': 'application/json',
      'content-length': Buffer.byteLength(text),
      expect: '100-continue',
    },
  });
  const answered = new Promise<{ status: number; code?: string }>((resolve, reject) => {
    req.on('response', (res) => {
      let received = '';
      res.on('data', (chunk: Buffer) => (received += chunk.toString()));
      res.on('end', () => {
        let code: string | undefined;
        try {
          code = (JSON.parse(received) as { error?: { code?: string } }).error?.code;
        } catch {
          code = undefined;
        }
        resolve({ status: res.statusCode ?? 0, code });
      });
    });
    req.on('error', reject);
  });
  // without a 'checkContinue' listener, Node's server answers 100 Continue as it emits 'request'
  await new Promise<void>((resolve, reject) => {
    req.once('continue', resolve);
    req.once('error', reject);
    req.flushHeaders();
  });
  req.write(text.slice(0, 1));
  return {
    finish() {
      req.end(text.slice(1));
      return answered;
    },
  };
}
