import net from 'node:net';
import { readNodeState, takesWrites, type GaleraNodeSpec } from './galera';

/**
 * HAProxy's agent check for the database nodes (HAProxy sends a node's name and a newline; we
 * answer `up` or `down`). A node that answers its port may still refuse writes: one cut off
 * from the others (non-primary), or one still joining or donating. Only a synced member of the
 * primary component is `up`, so HAProxy sends writes nowhere else.
 */
export async function startNodeCheckAgent(
  host: string,
  port: number,
  nodes: GaleraNodeSpec[],
): Promise<{ close(): Promise<void> }> {
  const server = net.createServer((socket) => {
    let asked = '';
    socket.setTimeout(5_000, () => socket.destroy());
    socket.on('error', () => undefined);
    socket.on('data', (chunk) => {
      asked += chunk.toString('utf8');
      if (!asked.includes('\n')) return;
      const node = nodes.find((n) => n.name === asked.trim());
      void (node ? readNodeState(node) : Promise.resolve(null)).then((state) => {
        socket.end(state && takesWrites(state) ? 'up\n' : 'down\n');
      });
    });
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, host, () => resolve());
  });
  return {
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
