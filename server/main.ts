// `npm run ship-server [-- --dir FOLDER] [--host ADDRESS] [--port N] [--in-memory]`: starts the
// embedded ship server and prints the address to give the other laptops.
import { parseArgs } from 'node:util';
import { startShipServer } from './shipServer.ts';

const { values } = parseArgs({
  options: {
    dir: { type: 'string', default: 'ship-server-data' },
    host: { type: 'string', default: '127.0.0.1' },
    port: { type: 'string' },
    'in-memory': { type: 'boolean', default: false },
    help: { type: 'boolean', short: 'h', default: false },
  },
});

if (values.help) {
  console.log(`Usage: npm run ship-server -- [--dir FOLDER] [--host ADDRESS] [--port N] [--in-memory]

Starts PouchDB Server (CouchDB's HTTP interface) with its data in FOLDER (default
ship-server-data). It listens on loopback unless --host names the ship's network address.
A fresh server lets everyone in as admin: add an admin and a user per laptop (README).`);
  process.exit(0);
}

const port = values.port === undefined ? undefined : Number(values.port);
if (port !== undefined && !(Number.isInteger(port) && port > 0 && port < 65536)) {
  console.error(`ship-server: --port must be a whole number from 1 to 65535, not ${values.port}`);
  process.exit(2);
}

const server = await startShipServer({ dir: values.dir, host: values.host, port, inMemory: values['in-memory'] });
console.log(`Ship server (PouchDB Server) on ${server.url}`);
console.log(`Data folder: ${server.dir}${values['in-memory'] ? ' (in memory: nothing is kept)' : ''}`);
console.log(`Give the laptops this address in Settings > Ship server. Stop with Ctrl+C.`);
const stop = () => void server.stop().then(() => process.exit(0));
process.on('SIGINT', stop);
process.on('SIGTERM', stop);
server.process.once('exit', (code) => {
  console.error(`ship server exited (${code ?? 'signal'})`);
  process.exit(1);
});
