// `pull --server URL --cruise ID -o log.json` and `push FILE --server URL`: a cruise database on
// a CouchDB server (the ship's, or a shore copy) to a log file and back, through the same
// documents, checks and merge rules as the app's sync (src/sync).
import { CouchClient, CouchError } from '../../sync/couch.ts';
import { pullBundle, pushBundle } from '../../sync/fileSync.ts';
import { cruiseDatabaseName } from '../../sync/ids.ts';
import { parseOptions, stringOption } from '../args.ts';
import { EXIT_FAILURE, EXIT_OK, UsageError, type CliIO, type Command } from '../command.ts';
import { loadLog, printProblems, writeLog } from '../logFiles.ts';

const PASSWORD_VARIABLE = 'FLOE_LEDGER_PASSWORD';

const AUTH_HELP = `  --server URL   the CouchDB server, e.g. http://192.168.1.10:5984/
  --user NAME    log in as NAME (a CouchDB session); the password is read from the
                 environment variable ${PASSWORD_VARIABLE}, never from the command line`;

async function connect(values: Record<string, string | boolean | undefined>, env: NodeJS.ProcessEnv): Promise<CouchClient> {
  const url = stringOption(values, 'server', true);
  let client: CouchClient;
  try {
    client = new CouchClient({ url, cookies: 'manual' });
  } catch (e) {
    throw new UsageError(`--server "${url}": ${e instanceof Error ? e.message : String(e)}`);
  }
  const user = stringOption(values, 'user');
  if (user !== undefined) {
    const password = env[PASSWORD_VARIABLE];
    if (password === undefined) throw new UsageError(`--user needs the password in the environment variable ${PASSWORD_VARIABLE}`);
    await client.logIn(user, password);
  }
  return client;
}

function serverFailure(io: CliIO, e: unknown): number {
  if (e instanceof CouchError) {
    io.stderr(`server: ${e.message}`);
    return EXIT_FAILURE;
  }
  throw e;
}

export function pullCommandFor(env: NodeJS.ProcessEnv = process.env): Command {
  return {
    name: 'pull',
    summary: 'write a cruise held on a CouchDB server (ship or shore) to a log file',
    usage: `Usage: npm run cli -- pull --server URL --cruise ID -o OUT [--user NAME]

Reads the cruise's database (floe-ledger-<cruise id>) and writes its log. Every document is
checked as an imported file would be; a refused one is named with its reason, left out, and
makes the exit code 1 (the log of the others is still written). An OUT ending in .zip is an
archive with the photos' images; a JSON log lists the photos without them.
${AUTH_HELP}`,
    async run(args, io) {
      const { values } = parseOptions(args, { server: { type: 'string' }, cruise: { type: 'string' }, out: { type: 'string', short: 'o' }, user: { type: 'string' } });
      const cruiseId = stringOption(values, 'cruise', true);
      const out = stringOption(values, 'out', true);
      try {
        const client = await connect(values, env);
        const r = await pullBundle(client, cruiseId);
        for (const x of r.refused) io.stderr(`refused ${x.docId}: ${x.reason}`);
        if (!r.bundle) {
          io.stderr(`the server holds no readable log of cruise ${cruiseId} (database ${cruiseDatabaseName(cruiseId)}, ${r.documents} documents); nothing written`);
          return EXIT_FAILURE;
        }
        writeLog(out, r.bundle, r.photos);
        const b = r.bundle;
        io.stdout(`wrote ${out}: ${b.observations.length} observations, ${b.history.length} earlier revisions, ${b.conflicts.length} conflicting copies, ${b.track.length} track points, ${b.photos.length} photos from ${r.documents} documents`);
        return r.refused.length > 0 ? EXIT_FAILURE : EXIT_OK;
      } catch (e) {
        return serverFailure(io, e);
      }
    },
  };
}

export function pushCommandFor(env: NodeJS.ProcessEnv = process.env): Command {
  return {
    name: 'push',
    summary: 'put a log file on a CouchDB server as the cruise\'s documents',
    usage: `Usage: npm run cli -- push FILE --server URL [--user NAME]

Checks FILE as an import does, then sends the documents the server does not hold yet to the
cruise's database (created when missing and allowed). Sending the same file again sends nothing.
A zip archive also sends its photos, each with its image attached.
${AUTH_HELP}`,
    async run(args, io) {
      const { values, positionals } = parseOptions(args, { server: { type: 'string' }, user: { type: 'string' } }, true);
      if (positionals.length !== 1) throw new UsageError('give exactly one FILE');
      const log = loadLog(positionals[0] as string);
      if (!log.ok) {
        printProblems(io, log);
        return EXIT_FAILURE;
      }
      try {
        const client = await connect(values, env);
        const r = await pushBundle(client, log.bundle, undefined, log.photos);
        for (const x of r.rejected) io.stderr(`the server refused ${x.docId}: ${x.reason}`);
        io.stdout(`${log.file}: ${r.onServer.length} of ${r.total} documents are on the server (database ${cruiseDatabaseName(log.bundle.cruise.id)})`);
        return r.rejected.length > 0 ? EXIT_FAILURE : EXIT_OK;
      } catch (e) {
        return serverFailure(io, e);
      }
    },
  };
}

export const pullCommand = pullCommandFor();
export const pushCommand = pushCommandFor();
