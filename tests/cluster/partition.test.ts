import net from 'node:net';
import path from 'node:path';
import { rmSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { clusterSettings } from '../../server/ops/cluster-rig';
import {
  killGaleraNode,
  nodeConnection,
  readNodeState,
  startGaleraNode,
  takesWrites,
  type GaleraNodeSpec,
} from '../../server/ops/galera';
import { startNodeCheckAgent } from '../../server/ops/node-check';
import { dataDir } from '../../server/ops/paths';
import { canMakeNamespaces, makeNodeNetwork, type NodeNetwork } from '../support/netns';
import { onNode, waitFor } from '../support/cluster-kit';

// Three nodes, each in a network namespace of its own, joined by a bridge; the test cuts one
// node's link. Needs root (as CI runs); without it the test is skipped and says why.
const root = canMakeNamespaces();
const settings = clusterSettings({
  ...process.env,
  CLUSTER_DIR: path.join(dataDir, 'cluster-partition-test'),
});
let network: NodeNetwork | undefined;
let nodes: GaleraNodeSpec[] = [];
let agent: { close(): Promise<void> } | undefined;

beforeAll(async () => {
  if (!root) return;
  rmSync(settings.dir, { recursive: true, force: true });
  network = makeNodeNetwork('lxtp', 3, '10.213.77');
  nodes = settings.nodes.map((n, i) => ({
    ...n,
    address: network!.addresses[i]!,
    netns: network!.namespaces[i]!,
  }));
  await startGaleraNode(nodes[0]!, nodes, { bootstrap: true });
  for (const node of nodes.slice(1)) await startGaleraNode(node, nodes, { bootstrap: false });
  agent = await startNodeCheckAgent('127.0.0.1', settings.checkPort, nodes);
  await onNode(nodes[0]!, async (db) => {
    await db.query('CREATE DATABASE partition_check');
    await db.query(
      'CREATE TABLE partition_check.tap (id BIGINT AUTO_INCREMENT PRIMARY KEY, idempotency_key VARCHAR(64) NOT NULL UNIQUE, written_on VARCHAR(8) NOT NULL) ENGINE=InnoDB',
    );
  });
}, 300_000);

afterAll(async () => {
  await agent?.close();
  for (const node of nodes) await killGaleraNode(node).catch(() => undefined);
  network?.remove();
}, 60_000);

async function write(node: GaleraNodeSpec, key: string): Promise<void> {
  const db = await nodeConnection(node);
  try {
    await db.query('INSERT INTO partition_check.tap (idempotency_key, written_on) VALUES (?, ?)', [
      key,
      node.name,
    ]);
  } finally {
    await db.end();
  }
}

async function keysOn(node: GaleraNodeSpec): Promise<string[]> {
  return onNode(node, async (db) => {
    const [rows] = await db.query(
      'SELECT idempotency_key AS k FROM partition_check.tap ORDER BY idempotency_key',
    );
    return (rows as { k: string }[]).map((r) => r.k);
  });
}

/** What the HAProxy agent answers for a node. */
function agentSays(name: string): Promise<string> {
  return new Promise((resolve, reject) => {
    const socket = net.createConnection(settings.checkPort, '127.0.0.1');
    let answer = '';
    socket.on('connect', () => socket.write(`${name}\n`));
    socket.on('data', (d) => (answer += d.toString('utf8')));
    socket.on('end', () => resolve(answer.trim()));
    socket.on('error', reject);
  });
}

describe.skipIf(!root)('(d) a network partition that leaves one node alone', () => {
  it('the lone node refuses writes rather than diverging, and catches up once the link is back', async () => {
    const [node1, node2, node3] = nodes as [GaleraNodeSpec, GaleraNodeSpec, GaleraNodeSpec];
    await write(node3, 'before-the-cut-0000000000000000000000');
    expect(await agentSays('node3')).toBe('up');

    network!.cut(2);
    await waitFor(
      'node3 to find itself outside the primary component',
      async () => (await readNodeState(node3)).clusterStatus !== 'Primary',
    );
    await waitFor(
      'node1 and node2 to go on as a cluster of two',
      async () => (await readNodeState(node1)).clusterSize === 2,
    );
    expect(takesWrites(await readNodeState(node1))).toBe(true);

    // The lone node refuses: a write there would be one the others never see.
    const refused = await write(node3, 'while-cut-on-the-lone-node-000000000').then(
      () => null,
      (error: { code?: string; errno?: number }) => error,
    );
    expect(refused?.code).toBe('ER_UNKNOWN_COM_ERROR'); // 1047: WSREP has not yet prepared node
    expect(await agentSays('node3')).toBe('down');
    expect(await agentSays('node1')).toBe('up');

    // The majority side goes on taking writes.
    await write(node1, 'while-cut-on-node1-00000000000000000');
    await write(node2, 'while-cut-on-node2-00000000000000000');

    network!.restore(2);
    await waitFor(
      'node3 to rejoin and be synced',
      async () => takesWrites(await readNodeState(node3)),
      60_000,
    );
    expect(await agentSays('node3')).toBe('up');
    const expected = [
      'before-the-cut-0000000000000000000000',
      'while-cut-on-node1-00000000000000000',
      'while-cut-on-node2-00000000000000000',
    ].sort();
    for (const node of nodes) expect(await keysOn(node)).toEqual(expected);
  });
});
