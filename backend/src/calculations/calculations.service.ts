import {
  BadRequestException,
  ConflictException,
  ForbiddenException,
  Injectable,
  Logger,
  NotFoundException,
} from '@nestjs/common';
import { Readable } from 'node:stream';
import { InjectQueue } from '@nestjs/bullmq';
import { InjectRepository } from '@nestjs/typeorm';
import { Queue } from 'bullmq';
import { In, IsNull, Repository } from 'typeorm';
import {
  ANALYSIS_POLARISATIONS,
  ANALYSIS_QUANTITIES,
  analysisIndex,
  validateAnalysisRequest,
  type AnalysisInput,
  type AnalysisRequest,
  type AnalysisQuantity,
  type AnalysisSummary,
} from '@quietglass/shared/analysis';
import {
  MAX_ACTIVE_JOBS_PER_USER,
  overBudget,
  tooManyActiveJobs,
  type BudgetedKind,
  type JobSize,
} from '@quietglass/shared/budgets';
import {
  VERSION_CALCULATION_KINDS,
  type CalculationKind,
  type VersionCalculationKind,
} from '@quietglass/shared/calculations';
import { designStackDescription, engineBackSurface, type NamedModel } from '@quietglass/shared/designs';
import { createSpectrumPlan } from '@quietglass/shared/optics/batch';
import { OpticsInputError } from '@quietglass/shared/optics/errors';
import { parseStack } from '@quietglass/shared/optics/stack';
import { isUniqueViolation } from '../common/db-errors.js';
import { QueueUnavailableError, isOutage, withDeadline } from '../common/outage.js';
import { contentHash } from '../common/stable-json.js';
import { DesignsService } from '../designs/designs.service.js';
import {
  ANALYSIS_JOB,
  COMPUTE_JOB_OPTIONS,
  COMPUTE_QUEUE,
  QUEUE_ADD_TIMEOUT_MS,
  type ComputeJobData,
} from '../queue/queue.constants.js';
import type { User } from '../users/user.entity.js';
import { Calculation } from './calculation.entity.js';
import { optimiseJobSize, type OptimiseInput, type OptimiseKind } from './optimise-jobs.js';
import { elementAt } from '@quietglass/shared/checked';

/**
 * The BullMQ job id of a calculation: one job per calculation, so a double add is a no-op. The
 * creation time keeps ids unique even when a database is recreated while Redis keeps old jobs.
 */
/** Lines per piece of a streamed result CSV. */
const CSV_LINES_PER_PIECE = 4000;

export const jobIdOf = (c: Pick<Calculation, 'id' | 'createdAt'>) => `calc-${c.id}-${c.createdAt.getTime()}`;

/** A fraction as percent with 4 decimals; −0.0000 from rounding is written 0.0000. */
function percent4(fraction: number): string {
  const text = (100 * fraction).toFixed(4);
  return text === '-0.0000' ? '0.0000' : text;
}

@Injectable()
export class CalculationsService {
  private readonly logger = new Logger('Calculations');

  constructor(
    @InjectRepository(Calculation) private readonly calculations: Repository<Calculation>,
    @InjectQueue(COMPUTE_QUEUE) private readonly queue: Queue<ComputeJobData>,
    private readonly designs: DesignsService,
  ) {}

  /**
   * Queues a full analysis of a design version. An identical request (same stack, materials and
   * grid) that is queued, running or done returns that calculation instead (`reused`).
   */
  async submitAnalysis(
    designId: number,
    number: number,
    rawRequest: unknown,
    user: User,
  ): Promise<{ calculation: Calculation; reused: boolean }> {
    const { content, materials } = await this.designs.contentForCompute(designId, number);
    let input: AnalysisInput;
    try {
      const request = validateAnalysisRequest(rawRequest);
      checkMaterialRanges(materials, request);
      const stack = designStackDescription(content, materials);
      const back = engineBackSurface(content.backSurface);
      // Fail now, not on the worker, when the materials do not cover the grid's wavelengths.
      createSpectrumPlan(
        parseStack(stack),
        {
          wavelengthsNm: [request.fromNm, request.toNm],
          anglesDeg: [request.angleFromDeg],
          polarisations: ['s'],
        },
        { back },
      );
      input = { stack, back, request };
    } catch (err) {
      if (err instanceof OpticsInputError) throw new BadRequestException({ message: [err.message] });
      throw err;
    }
    checkBudget('analysis', {
      layers: input.stack.layers.length + (input.stack.back_layers?.length ?? 0),
      samples: input.request.wavelengthCount * input.request.angleCount,
    });
    const inputHash = contentHash(input);
    const existing = await this.findLive(inputHash);
    if (existing) return { calculation: existing, reused: true };
    await this.checkActiveJobs(user);
    let saved: Calculation;
    try {
      saved = await this.calculations.save(
        this.calculations.create({
          kind: 'analysis',
          inputHash,
          input,
          designId,
          versionNumber: number,
          status: 'queued',
          progress: 0,
          createdBy: user,
        }),
      );
    } catch (err) {
      // Another identical request won the race: share its calculation.
      const winner = isUniqueViolation(err) ? await this.findLive(inputHash) : null;
      if (winner) return { calculation: winner, reused: true };
      throw err;
    }
    await this.enqueue(ANALYSIS_JOB, saved);
    return { calculation: await this.get(saved.id), reused: false };
  }

  /** Queues an optimisation job; an identical request (same stack, mask and options) shares its calculation. */
  async submitOptimisation(
    kind: OptimiseKind,
    input: OptimiseInput,
    user: User,
    where: { designId: number; versionNumber: number; runId?: number },
  ): Promise<{ calculation: Calculation; reused: boolean }> {
    checkBudget(kind, optimiseJobSize(input));
    const inputHash = contentHash(input);
    const existing = await this.findLive(inputHash, kind);
    if (existing) return { calculation: existing, reused: true };
    await this.checkActiveJobs(user);
    let saved: Calculation;
    try {
      saved = await this.calculations.save(
        this.calculations.create({
          kind,
          inputHash,
          input,
          designId: where.designId,
          versionNumber: where.versionNumber,
          runId: where.runId ?? null,
          status: 'queued',
          progress: 0,
          live: { history: [] },
          createdBy: user,
        }),
      );
    } catch (err) {
      const winner = isUniqueViolation(err) ? await this.findLive(inputHash, kind) : null;
      if (winner) return { calculation: winner, reused: true };
      throw err;
    }
    await this.enqueue(kind, saved);
    return { calculation: await this.get(saved.id), reused: false };
  }

  /** A user may have only so many calculations queued or running (an identical request is shared). */
  private async checkActiveJobs(user: User): Promise<void> {
    const active = await this.calculations.countBy({
      createdBy: { id: user.id },
      status: In(['queued', 'running']),
    });
    const limit = activeJobLimit();
    if (active >= limit) throw new ConflictException(tooManyActiveJobs(active, limit));
  }

  /**
   * Puts the calculation on the compute queue. When Redis does not take it in time the calculation
   * is marked failed (so it holds no slot and no identical request reuses it) and the API says 503.
   */
  private async enqueue(name: string, saved: Calculation): Promise<void> {
    try {
      await withDeadline(
        this.queue.add(name, { calculationId: saved.id }, { jobId: jobIdOf(saved), ...COMPUTE_JOB_OPTIONS }),
        QUEUE_ADD_TIMEOUT_MS,
        'queueing the calculation',
      );
    } catch (err) {
      await this.calculations
        .update(
          { id: saved.id, status: 'queued' },
          { status: 'failed', error: 'The job queue was not reachable', finishedAt: new Date() },
        )
        .catch(() => undefined);
      throw isOutage(err) ? err : new QueueUnavailableError(String(err));
    }
  }

  /**
   * The latest completed calculation of each design kind (analysis, Fit to mask, Grow layers,
   * Yield forecast) of a version, so a result shows again when the version is reopened.
   */
  async latestForVersion(
    designId: number,
    number: number,
  ): Promise<Record<VersionCalculationKind, Calculation | null>> {
    await this.designs.findVersion(designId, number);
    const latest = await Promise.all(
      VERSION_CALCULATION_KINDS.map((kind) =>
        this.calculations.findOne({
          where: { designId, versionNumber: number, kind, status: 'completed', runId: IsNull() },
          order: { id: 'DESC' },
        }),
      ),
    );
    return Object.fromEntries(VERSION_CALCULATION_KINDS.map((kind, i) => [kind, latest[i]])) as Record<
      VersionCalculationKind,
      Calculation | null
    >;
  }

  /** The latest completed Run diagnosis of a chamber run, or null. */
  latestDiagnosis(runId: number): Promise<Calculation | null> {
    return this.calculations.findOne({
      where: { runId, kind: 'diagnosis', status: 'completed' },
      order: { id: 'DESC' },
    });
  }

  /** The latest completed Run diagnosis of each of the runs that have one. */
  async latestDiagnoses(runIds: readonly number[]): Promise<Map<number, Calculation>> {
    if (runIds.length === 0) return new Map();
    const rows = await this.calculations.find({
      where: { runId: In([...runIds]), kind: 'diagnosis', status: 'completed' },
      order: { id: 'ASC' },
    });
    return new Map(rows.map((c) => [c.runId!, c]));
  }

  list(): Promise<Calculation[]> {
    return this.calculations.find({ order: { id: 'DESC' }, take: 100 });
  }

  async get(id: number): Promise<Calculation> {
    const calc = await this.calculations.findOneBy({ id });
    if (!calc) throw new NotFoundException(`Calculation ${id} does not exist`);
    return calc;
  }

  /** Stops a queued or running calculation; a finished one cannot be cancelled. */
  async cancel(id: number): Promise<Calculation> {
    const calc = await this.get(id);
    if (calc.status !== 'queued' && calc.status !== 'running') {
      throw new ConflictException(
        `Calculation ${id} is ${calc.status}; only a queued or running one can be cancelled`,
      );
    }
    const result = await this.calculations.update(
      { id, status: In(['queued', 'running']) },
      { status: 'cancelled', finishedAt: new Date(), error: 'Cancelled by the user' },
    );
    if (result.affected !== 1) return this.cancelRace(id);
    // A waiting job is removed; a running one sees the status between slices and stops.
    await withDeadline(this.queue.remove(jobIdOf(calc)), QUEUE_ADD_TIMEOUT_MS, 'removing the job').catch(
      () => 0,
    );
    return this.get(id);
  }

  /**
   * Deletes a calculation and its stored result, for the user who asked for it or an admin. A
   * queued or running one is taken off the queue; its worker sees it gone and stops. Who deleted
   * what is written to the structured log.
   */
  async remove(id: number, user: User): Promise<void> {
    const calc = await this.get(id);
    if (user.role !== 'admin' && calc.createdBy.id !== user.id) {
      throw new ForbiddenException(
        `Only ${calc.createdBy.displayName}, who asked for calculation ${id}, or an admin may delete it`,
      );
    }
    await this.calculations.delete({ id });
    await withDeadline(this.queue.remove(jobIdOf(calc)), QUEUE_ADD_TIMEOUT_MS, 'removing the job').catch(
      () => 0,
    );
    this.logger.log(
      JSON.stringify({
        event: 'calculation.deleted',
        calculationId: id,
        kind: calc.kind,
        status: calc.status,
        designId: calc.designId,
        createdBy: calc.createdBy.id,
        deletedBy: user.id,
        at: new Date().toISOString(),
      }),
    );
  }

  /** One quantity and polarisation of a completed analysis, as rows per angle. */
  async result(
    id: number,
    quantity: string,
    polarisation: string,
  ): Promise<{
    wavelengthsNm: number[];
    anglesDeg: number[];
    quantity: AnalysisQuantity;
    polarisation: string;
    values: number[][];
  }> {
    if (!(ANALYSIS_QUANTITIES as readonly string[]).includes(quantity)) {
      throw new BadRequestException(`quantity must be one of ${ANALYSIS_QUANTITIES.join(', ')}`);
    }
    if (!(ANALYSIS_POLARISATIONS as readonly string[]).includes(polarisation)) {
      throw new BadRequestException(`polarisation must be one of ${ANALYSIS_POLARISATIONS.join(', ')}`);
    }
    const { summary, values } = await this.completed(id);
    const q = quantity as AnalysisQuantity;
    const pol = polarisation as (typeof ANALYSIS_POLARISATIONS)[number];
    const nW = summary.wavelengthsNm.length;
    const rows = summary.anglesDeg.map((_, ia) => {
      const start = analysisIndex(summary, q, pol, ia, 0);
      return Array.from(values.subarray(start, start + nW));
    });
    return {
      wavelengthsNm: summary.wavelengthsNm,
      anglesDeg: summary.anglesDeg,
      quantity: q,
      polarisation,
      values: rows,
    };
  }

  /**
   * The whole result as CSV: `wavelength_nm,angle_deg,pol,R_percent,T_percent,A_percent`, values in
   * percent with 4 decimals (the spectrum upload reads it back, a quantity chosen),
   * produced in pieces of a few thousand lines as the client reads them, so a large result never
   * sits in memory as one string and the event loop is given back between pieces.
   */
  async resultCsv(id: number): Promise<Readable> {
    const { summary, values } = await this.completed(id);
    function* lines(): Generator<string> {
      yield 'wavelength_nm,angle_deg,pol,R_percent,T_percent,A_percent\n';
      let chunk: string[] = [];
      for (const pol of ANALYSIS_POLARISATIONS) {
        for (let ia = 0; ia < summary.anglesDeg.length; ia++) {
          const angle = summary.anglesDeg[ia];
          for (let iw = 0; iw < summary.wavelengthsNm.length; iw++) {
            const at = (q: AnalysisQuantity) =>
              percent4(elementAt(values, analysisIndex(summary, q, pol, ia, iw), 'the stored result'));
            chunk.push(`${summary.wavelengthsNm[iw]},${angle},${pol},${at('R')},${at('T')},${at('A')}\n`);
            if (chunk.length === CSV_LINES_PER_PIECE) {
              yield chunk.join('');
              chunk = [];
            }
          }
        }
      }
      if (chunk.length > 0) yield chunk.join('');
    }
    return Readable.from(lines(), { objectMode: false, highWaterMark: 1 << 16 });
  }

  private async completed(id: number): Promise<{ summary: AnalysisSummary; values: Float64Array }> {
    const calc = await this.calculations.findOne({
      where: { id },
      select: { id: true, status: true, summary: true, values: true },
    });
    if (!calc) throw new NotFoundException(`Calculation ${id} does not exist`);
    if (calc.status !== 'completed' || !calc.summary || !calc.values) {
      throw new ConflictException(`Calculation ${id} is ${calc.status}; its result is not available`);
    }
    const buf = calc.values;
    const values = new Float64Array(buf.buffer.slice(buf.byteOffset, buf.byteOffset + buf.byteLength));
    return { summary: calc.summary as AnalysisSummary, values };
  }

  private findLive(inputHash: string, kind: CalculationKind = 'analysis'): Promise<Calculation | null> {
    return this.calculations.findOneBy({
      kind,
      inputHash,
      status: In(['queued', 'running', 'completed']),
    });
  }

  private async cancelRace(id: number): Promise<Calculation> {
    const now = await this.get(id);
    throw new ConflictException(
      `Calculation ${id} is ${now.status}; only a queued or running one can be cancelled`,
    );
  }
}

/** Jobs a user may have queued or running: QG_MAX_ACTIVE_JOBS, else the shared default. */
function activeJobLimit(): number {
  const v = Number(process.env.QG_MAX_ACTIVE_JOBS);
  return Number.isInteger(v) && v > 0 ? v : MAX_ACTIVE_JOBS_PER_USER;
}

/** A job larger than its kind's work budget is refused with the limit stated. */
function checkBudget(kind: BudgetedKind, size: JobSize): void {
  const problem = overBudget(kind, size);
  if (problem) throw new BadRequestException({ message: [problem] });
}

/** Each material must be valid over the whole analysed range: no result from data outside it. */
function checkMaterialRanges(materials: Map<number, NamedModel>, request: AnalysisRequest): void {
  const problems = [...materials.values()]
    .filter((m) => m.rangeNm && (request.fromNm < m.rangeNm.from || request.toNm > m.rangeNm.to))
    .map(
      (m) =>
        `${m.name} is valid over ${m.rangeNm?.from}–${m.rangeNm?.to} nm; the analysis asks for ${request.fromNm}–${request.toNm} nm`,
    );
  if (problems.length > 0) throw new BadRequestException({ message: problems });
}
