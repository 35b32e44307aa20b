// npm run bench: every speed figure the issues name, one `name: value` line each, so runs can
// be compared. Each figure is the median of several runs in one process.
import { runEngineBench } from './bench-engine';
import { runForecastBench } from './bench-forecast';
import { runGridBench } from './bench-grid';
import { runTimelineBench } from './bench-timeline';
import { runExportBench } from './bench-export';
import { runImportBench } from './bench-import';
import { runApiBench } from './bench-api';
import { runPlanBench } from './bench-plan';
import { runPlanScreenBench } from './bench-plan-screen';

const results: Record<string, number> = {
	...(await runEngineBench()),
	...(await runPlanBench()),
	...(await runForecastBench()),
	...(await runGridBench()),
	...(await runTimelineBench()),
	...(await runExportBench()),
	...(await runImportBench()),
	...(await runApiBench()),
	...(await runPlanScreenBench())
};
for (const [name, value] of Object.entries(results)) console.log(`${name}: ${value}`);
