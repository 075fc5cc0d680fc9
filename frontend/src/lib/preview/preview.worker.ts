/*
 * The preview worker: computes spectra, mask verdict and colour off the main thread, so typing in
 * the Layer grid never waits for the engine.
 */
import {
  answerPreviewRequest,
  createPreviewCalculator,
  previewTransferables,
  type PreviewWorkerRequest,
  type PreviewWorkerResponse,
} from './compute-preview';

/** The parts of the worker's global scope used here (the app is typed against the DOM library). */
interface PreviewWorkerScope {
  onmessage: ((event: MessageEvent<PreviewWorkerRequest>) => void) | null;
  postMessage(message: PreviewWorkerResponse, transfer: Transferable[]): void;
}

const scope = self as unknown as PreviewWorkerScope;
const calculator = createPreviewCalculator();

scope.onmessage = (event: MessageEvent<PreviewWorkerRequest>) => {
  const response = answerPreviewRequest(calculator, event.data);
  scope.postMessage(response, response.ok ? previewTransferables(response.result) : []);
};
