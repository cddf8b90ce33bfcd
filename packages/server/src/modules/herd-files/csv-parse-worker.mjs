// Parses a CSV text in a worker thread, so a large herd file does not hold up other requests while it is
// read. Plain JavaScript: a worker starts without the TypeScript loader.
import { parentPort, threadId, workerData } from 'node:worker_threads';
import { CsvError, parse } from 'csv-parse/sync';

try {
  const rows = parse(workerData.text, workerData.options);
  parentPort.postMessage({ rows, threadId });
} catch (error) {
  if (error instanceof CsvError) {
    parentPort.postMessage({ csvError: { code: error.code, message: error.message, lines: error.lines }, threadId });
  } else {
    parentPort.postMessage({ failure: String(error), threadId });
  }
}
