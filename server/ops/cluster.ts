import { demoSignIns } from './app-database';
import { buildClient } from './build-client';
import { clusterSettings, startCluster, type RunningCluster } from './cluster-rig';
import { clientDistDir } from './paths';

// `npm run cluster`: three Galera nodes, HAProxy and two or more API processes on loopback (see
// README, "Running as a cluster"). This process supervises; Ctrl-C stops everything in order.
const startedAt = performance.now();
const settings = clusterSettings();
let cluster: RunningCluster | undefined;
let stopping = false;

async function shutdown(reason: string, exitCode: number) {
  if (stopping) return;
  stopping = true;
  console.log(`\n${reason}: stopping the cluster …`);
  await cluster?.stop();
  console.log('• API processes, HAProxy, mail catcher and the three MariaDB nodes stopped.');
  process.exit(exitCode);
}
process.on('SIGINT', () => void shutdown('SIGINT', 0));
process.on('SIGTERM', () => void shutdown('SIGTERM', 0));

try {
  console.log(`• Client build: ${await buildClient()}`);
  cluster = await startCluster(settings, { clientDir: clientDistDir, log: console.log });
  for (const [i, api] of cluster.apis.entries())
    api?.child.once('exit', (code, signal) => {
      if (!stopping)
        console.log(`• API process ${i + 1} ended (${code ?? signal}); HAProxy routes around it.`);
    });
} catch (error) {
  console.error(
    `\n✗ The cluster could not start: ${error instanceof Error ? error.message : String(error)}`,
  );
  await shutdown('Start failed', 1);
}

const seconds = ((performance.now() - startedAt) / 1000).toFixed(1);
console.log(
  `\nLuxtempo cluster is ready (${seconds} s): ${cluster!.url}
  MariaDB Galera nodes: ${settings.nodes.map((n) => `${n.name} 127.0.0.1:${n.dbPort}`).join(', ')} (data in ${settings.dir})
  API processes: ${settings.apiPorts.map((p) => `127.0.0.1:${p}`).join(', ')}; HAProxy sends the database to one node at 127.0.0.1:${settings.databasePort}
  Mail catcher: SMTP 127.0.0.1:${settings.smtpPort}, inbox ${cluster!.mailWebUrl}
${demoSignIns(cluster!.config)}
Stop with Ctrl-C.`,
);
