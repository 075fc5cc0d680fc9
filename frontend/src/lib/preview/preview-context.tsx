import { createContext, useContext, useEffect, useMemo, useRef, type ReactNode } from 'react';
import {
  createInlinePreviewComputer,
  createWorkerPreviewComputer,
  type PreviewComputer,
} from './preview-computer';
import type { PreviewRequest, PreviewResult } from './compute-preview';

const PreviewComputerContext = createContext<PreviewComputer | null>(null);

/** Supplies the preview computer below (tests inject one that runs in place). */
export function PreviewComputerProvider({
  computer,
  children,
}: {
  computer: PreviewComputer;
  children: ReactNode;
}) {
  return <PreviewComputerContext value={computer}>{children}</PreviewComputerContext>;
}

export interface PreviewCompute {
  compute(request: PreviewRequest): Promise<PreviewResult>;
}

/**
 * The preview computer of the calling component: the injected one, else a Web Worker started on
 * first use and terminated when the component unmounts (in place where workers do not exist).
 */
export function usePreviewComputer(): PreviewCompute {
  const injected = useContext(PreviewComputerContext);
  const own = useRef<PreviewComputer | null>(null);
  useEffect(
    () => () => {
      own.current?.dispose();
      own.current = null;
    },
    [],
  );
  return useMemo(
    () => ({
      compute(request: PreviewRequest) {
        if (injected) return injected.compute(request);
        own.current ??=
          typeof Worker === 'undefined' ? createInlinePreviewComputer() : createWorkerPreviewComputer();
        return own.current.compute(request);
      },
    }),
    [injected],
  );
}
