import { z } from 'zod';
import { editionsSchema } from '@/lib/domain/editions';

const inches = (description: string) => z.number().nonnegative().describe(`${description} (inches)`);
const sqIn = (description: string) => z.number().nonnegative().describe(`${description} (square inches)`);
const policy = (description: string) =>
  z.enum(['never', 'over-finished-space', 'always']).describe(description);

export const fittingEquivalentKeys = [
  'mitered-45',
  'mitered-90',
  'smooth-6in-45',
  'smooth-6in-90',
  'smooth-8in-45',
  'smooth-8in-90',
  'smooth-10in-45',
  'smooth-10in-90',
] as const;
export type FittingEquivalentKey = (typeof fittingEquivalentKeys)[number];

export const gfciScopes = ['none', 'laundry-125v', 'laundry-125-250v', 'laundry-and-dryer-outlets'] as const;

/** A rule set's parameters: the thresholds an AHJ may amend without a deploy. */
export const ruleSetParametersSchema = z
  .object({
    editions: editionsSchema,
    exhaust: z
      .object({
        fittingEquivalentsIn: z
          .object(
            Object.fromEntries(
              fittingEquivalentKeys.map((key) => [key, inches(`Equivalent length of a ${key.replace(/-/g, ' ')}° elbow`)]),
            ) as Record<FittingEquivalentKey, z.ZodNumber>,
          )
          .strict()
          .describe('Equivalent length counted for each elbow, from the fitting table of the adopted code.'),
        maxDevelopedLengthIn: inches('Maximum developed length of the exhaust duct, transition duct not counted'),
        allowManufacturerLength: z
          .boolean()
          .describe("Whether the dryer maker's maximum duct length may replace the code maximum."),
        lengthLabelTrigger: z
          .enum(['never', 'concealed', 'over-max'])
          .describe('When a concealed-duct length label is needed: whenever concealed, or only over the code maximum.'),
        transitionMaxLengthIn: inches('Maximum length of the transition duct'),
        nominalDiameterIn: inches('Nominal diameter the exhaust duct must have'),
        minDuctThicknessIn: inches('Minimum wall thickness of a rigid metal exhaust duct'),
        terminationClearanceIn: inches('Minimum distance from the terminal to openings into the building; null where deleted by amendment').nullable(),
        fastenerMaxProtrusionIn: inches('How far a fastener may stand into the duct; 0 means no fastener may penetrate'),
        maxSupportSpacingIn: inches('Greatest distance between exhaust duct supports; null where the adopted code sets none').nullable(),
        minTerminalOpeningSqIn: sqIn("Least free area of the terminal's opening; null where the adopted code sets none").nullable(),
        shieldPlateMinClearanceIn: inches('Distance from the framing face below which a concealed duct needs steel shield plates'),
        boosterFanPolicy: z
          .enum(['listed-fans', 'power-ventilators-only'])
          .describe('Which fans may be added to the exhaust: any listed fan, or only listed dryer exhaust duct power ventilators.'),
      })
      .strict()
      .describe('Dryer exhaust.'),
    makeupAir: z
      .object({
        exhaustCfmThreshold: z.number().nonnegative().describe('Exhaust rate above which make-up air must be provided (cfm).'),
        closetOpeningMinSqIn: sqIn('Minimum opening into a closet designed for a dryer'),
      })
      .strict()
      .describe('Make-up air.'),
    gas: z
      .object({
        shutoffMaxDistanceIn: inches('Maximum distance from the shut-off valve to the appliance'),
        connectorMaxLengthIn: inches('Maximum length of the appliance connector'),
      })
      .strict()
      .describe('Gas supply.'),
    electrical: z
      .object({
        laundryCircuitMinAmps: z.number().positive().describe('Minimum rating of the laundry branch circuit (amperes).'),
        receptacleMaxDistanceIn: inches("Maximum distance from an appliance's receptacle to the appliance"),
        gfciScope: z
          .enum(gfciScopes)
          .describe('Which laundry receptacles need GFCI protection under the adopted NEC edition.'),
        afciLaundry: z.boolean().describe('Whether 120-V 15/20-A laundry circuits need AFCI protection.'),
        require4WireDryer: z.boolean().describe('Whether new dryer circuits must be 4-wire.'),
        dryerCircuitMinAmps: z.number().positive().describe('Minimum rating of an electric dryer circuit (amperes).'),
      })
      .strict()
      .describe('Electrical supply.'),
    plumbing: z
      .object({
        standpipeMinIn: inches('Minimum standpipe height above the trap weir'),
        standpipeMaxIn: inches('Maximum standpipe height above the trap weir'),
        washerTrapMinIn: inches('Minimum nominal size of the washer trap'),
        drainPanPolicy: policy('Where a drain pan under the washer is required (model codes: never).'),
        drainPanSection: z.string().nullable().describe('Section of the local amendment requiring the pan, for citations.'),
        leakShutoffPolicy: policy('Where an automatic leak shut-off is required (model codes: never).'),
        leakShutoffSection: z.string().nullable().describe('Section of the local amendment requiring leak shut-off.'),
      })
      .strict()
      .describe('Water supply and drain.'),
    service: z
      .object({
        removalMarginIn: inches('Clear opening width needed beyond the widest unit to take it out'),
        rearZoneMinIn: inches('Space wanted behind the units for the vent elbow, hoses and cord'),
      })
      .strict()
      .describe('Service clearance (common practice).'),
    doors: z
      .object({
        hingeCountChart: z
          .array(
            z
              .object({
                maxDoorHeightIn: inches('Tallest door this row covers'),
                hinges: z.number().int().positive().describe('Hinges needed up to that height.'),
              })
              .strict()
              .describe('One row of the hinge-count chart.'),
          )
          .min(1)
          .describe('Hinges needed by door height, in rising order of height.'),
        hingeEdgeMinIn: inches('Least distance from a door edge to the nearest hinge cup centre'),
        hingeEdgeMaxIn: inches('Greatest distance from a door edge to the nearest hinge cup centre'),
        hingeArmDepthIn: inches('Depth needed between the closed doors and the appliance fronts for hinge arms'),
      })
      .strict()
      .describe('Enclosure door hardware (hinge makers and common practice).'),
    // Optional so API clients written before amendments were recorded still save; stored rows of
    // earlier versions read with an empty list (lib/domain/params/upgrade.ts).
    amendments: z
      .array(
        z
          .object({
            parameter: z.string().trim().min(1, 'Name the parameter the amendment changes.').max(120).describe('Parameter the amendment changes, e.g. exhaust.maxDevelopedLengthIn.'),
            citation: z
              .string()
              .trim()
              .min(1, 'Cite the local amendment: the ordinance or amendment section, e.g. "Ord. 12-34 §2".')
              .max(200, 'Keep the citation under 200 characters.')
              .describe('Ordinance or amendment section that changes it.'),
          })
          .strict(),
      )
      .max(64, 'At most 64 amendment citations.')
      .optional()
      .describe('Local amendments that change a model-code value, each with its citation.'),
  })
  .strict()
  .describe('Rule set parameters.');

export type RuleSetParameters = z.infer<typeof ruleSetParametersSchema>;
