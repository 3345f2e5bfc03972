import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';

/**
 * One vetting test. Rendered generically from its own label and detail, so a test added on the
 * server (a transit-shape test, say) shows without a change here.
 */
const diagnosticSchema = z.object({
  code: z.string(),
  label: z.string(),
  value: z.number().nullable(),
  verdict: z.enum(['pass', 'warn']),
  detail: z.string(),
});

export type VettingDiagnostic = z.infer<typeof diagnosticSchema>;

const vettingSchema = z.object({
  source: z.enum(['period-search', 'dip']),
  transit: z.object({
    periodDays: z.number().nullable(),
    depthPpm: z.number(),
    depthErrPpm: z.number().nullable().optional(),
    durationHours: z.number(),
    snr: z.number(),
    oddEvenDifferenceSigma: z.number().nullable().optional(),
    depthSecondaryPpm: z.number().nullable().optional(),
    depthSecondaryErrPpm: z.number().nullable().optional(),
  }),
  star: z.object({ radiusRsun: z.number(), massMsun: z.number(), teffK: z.number() }),
  derived: z.object({
    radius: z.object({
      radiusRatio: z.number(),
      radiusRatioErr: z.number(),
      radiusEarth: z.number(),
      radiusEarthErr: z.number(),
      radiusJupiter: z.number(),
      radiusJupiterErr: z.number(),
    }),
    stellarDensityGcm3: z.number(),
    /** For a single transit: the periods its duration allows, for impact parameters 0 to 0.9. */
    singleTransitPeriodRange: z
      .object({
        periodMinDays: z.number(),
        periodMaxDays: z.number(),
        impactMin: z.number(),
        impactMax: z.number(),
      })
      .nullable(),
    orbit: z
      .object({
        semiMajorAxisAu: z.number(),
        semiMajorAxisErrAu: z.number(),
        aOverRstar: z.number(),
        equilibriumTemperatureK: z.number(),
        transitProbability: z.number(),
        transitProbabilityErr: z.number(),
        statement: z.string(),
      })
      .nullable(),
  }),
  diagnostics: z.array(diagnosticSchema),
});

export type Vetting = z.infer<typeof vettingSchema>;

const responseSchema = z.object({ vetting: vettingSchema });

/** Throws the API's 409 when there is nothing to vet yet (no dip, no finished search, no stellar parameters). */
export async function getVetting(targetId: number, signal?: AbortSignal): Promise<Vetting> {
  const { vetting } = await api.get(apiPaths.targetVetting(targetId), responseSchema, { signal });
  return vetting;
}

export const vettingQueryOptions = (targetId: number) =>
  queryOptions({
    queryKey: queryKeys.targets.vetting(targetId),
    queryFn: ({ signal }) => getVetting(targetId, signal),
  });

export function useVetting(targetId: number, { enabled = true }: { enabled?: boolean } = {}) {
  return useQuery({ ...vettingQueryOptions(targetId), enabled });
}
