import { execFileSync, spawnSync } from 'node:child_process';

/**
 * A small private network for the partition test (Debian's iproute2): one namespace per database
 * node, each joined by a veth pair to a bridge in a namespace of its own. Addresses exist only
 * inside those namespaces; nothing on the host's own interfaces changes. Cutting a node's link
 * (its bridge-side veth down) is a real partition: packets stop, the node learns it alone.
 */
export interface NodeNetwork {
  namespaces: string[];
  addresses: string[];
  cut(index: number): void;
  restore(index: number): void;
  remove(): void;
}

function ip(...args: string[]) {
  execFileSync('ip', args, { stdio: ['ignore', 'ignore', 'pipe'] });
}

/** Names short enough for interfaces (15 characters), unique to this run. */
export function makeNodeNetwork(prefix: string, count: number, subnet: string): NodeNetwork {
  const sw = `${prefix}sw`;
  const namespaces = Array.from({ length: count }, (_, i) => `${prefix}n${i + 1}`);
  const addresses = namespaces.map((_, i) => `${subnet}.${i + 1}`);
  const bridgeSide = (i: number) => `${prefix}b${i + 1}`;
  const network: NodeNetwork = {
    namespaces,
    addresses,
    cut: (i) => ip('-n', sw, 'link', 'set', bridgeSide(i), 'down'),
    restore: (i) => ip('-n', sw, 'link', 'set', bridgeSide(i), 'up'),
    remove() {
      for (const ns of [...namespaces, sw])
        spawnSync('ip', ['netns', 'del', ns], { stdio: 'ignore' });
    },
  };
  network.remove(); // whatever an interrupted earlier run left
  try {
    ip('netns', 'add', sw);
    ip('-n', sw, 'link', 'set', 'lo', 'up');
    ip('-n', sw, 'link', 'add', 'br0', 'type', 'bridge');
    ip('-n', sw, 'link', 'set', 'br0', 'up');
    for (const [i, ns] of namespaces.entries()) {
      const nodeSide = `${prefix}v${i + 1}`;
      ip('netns', 'add', ns);
      ip('-n', ns, 'link', 'set', 'lo', 'up');
      ip(
        'link',
        'add',
        nodeSide,
        'netns',
        ns,
        'type',
        'veth',
        'peer',
        'name',
        bridgeSide(i),
        'netns',
        sw,
      );
      ip('-n', ns, 'addr', 'add', `${addresses[i]}/24`, 'dev', nodeSide);
      ip('-n', ns, 'link', 'set', nodeSide, 'up');
      ip('-n', sw, 'link', 'set', bridgeSide(i), 'master', 'br0');
      ip('-n', sw, 'link', 'set', bridgeSide(i), 'up');
    }
  } catch (error) {
    network.remove();
    throw error;
  }
  return network;
}

/** Whether this process may make namespaces (root, with iproute2). */
export function canMakeNamespaces(): boolean {
  if (process.getuid?.() !== 0) return false;
  return spawnSync('ip', ['netns', 'list'], { stdio: 'ignore' }).status === 0;
}
