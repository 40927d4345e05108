// `npm run bench`: speed figures of the hot paths, printed, never asserted in unit tests.
import os from 'node:os';
import { describeTideTransformBench, describeTransformBench, runTideTransformBench, runTransformBench } from './transform-bench';
import { runEngineBench } from './engine-bench';
import { runResponseBench } from './response-bench';
import { runEnsembleBench } from './ensemble-bench';
import { runImportBench } from './import-bench';
import { runNetcdfBench } from './netcdf-bench';
import { describeColdStart, measureColdStart } from './cold-start';

console.log(
  `Lullwatch bench on ${os.cpus().length} cores (${os.cpus()[0]?.model ?? 'unknown CPU'}), Node ${process.version}, load average ${os
    .loadavg()
    .map((x) => x.toFixed(1))
    .join(' ')}\n`,
);
// The response bench first: it times cold passes in fresh worker threads, and after the other
// sections this process's collector still works for seconds on the second core (measured: both
// cases 30-50 % slower, the ratio 2.06-2.83x instead of about 2.2x alone).
await runResponseBench();
console.log('');
console.log(describeTransformBench(await runTransformBench()));
console.log(describeTideTransformBench(await runTideTransformBench()));
console.log('');
await runEngineBench();
console.log('');
await runEnsembleBench();
console.log('');
await runImportBench();
console.log('');
await runNetcdfBench();
console.log('');
console.log(describeColdStart(await measureColdStart()));
