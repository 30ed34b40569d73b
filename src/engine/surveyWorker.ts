/// <reference lib="webworker" />
// The module Web Worker the app runs surveys in (see runSurvey.ts).
import { attachSurveyWorker, type SurveyWorkerScope } from './runSurvey';

attachSurveyWorker(self as unknown as SurveyWorkerScope);
