// Every database test runs against an in-memory IndexedDB in Node.
import 'fake-indexeddb/auto';
