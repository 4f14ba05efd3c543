import { parseEditionOrThrow, type Editions } from '@/lib/domain/editions';
import { mmToInches } from '@/lib/domain/units';
import type { RuleSetParameters } from '@/lib/domain/params/schema';

const FT = 12;

/**
 * Parameters as the model codes set them for the given editions. Local amendments are applied
 * on top (see buildRuleSet's overrides).
 */
export function defaultParameters(editions: Editions): RuleSetParameters {
  const building = parseEditionOrThrow(editions.building);
  const mechanical = parseEditionOrThrow(editions.mechanical);
  const nec = parseEditionOrThrow(editions.electrical).year;
  // Dwellings follow the residential code's dryer-exhaust section when one is adopted.
  const exhaustCode = building.code === 'IRC' ? building : mechanical;
  const exhaustYear = exhaustCode.year;

  return {
    editions: { ...editions },
    exhaust: {
      // IRC Table M1502.4.5.1 (2018) / M1502.4.6.1 (2021); unchanged since 2009.
      fittingEquivalentsIn: {
        'mitered-45': 2 * FT + 6,
        'mitered-90': 5 * FT,
        'smooth-6in-45': 1 * FT,
        'smooth-6in-90': 1 * FT + 9,
        'smooth-8in-45': 1 * FT,
        'smooth-8in-90': 1 * FT + 7,
        'smooth-10in-45': 9,
        'smooth-10in-90': 1 * FT + 6,
      },
      maxDevelopedLengthIn: 35 * FT, // IRC 2018 M1502.4.5.1; 2021 M1502.4.6.1
      allowManufacturerLength: true, // IRC 2018 M1502.4.5.2; 2021 M1502.4.6.2
      // IRC 2015 M1502.4.6 labels any concealed duct; 2018+ only where the length exceeds the maximum.
      lengthLabelTrigger: exhaustYear >= 2018 ? 'over-max' : 'concealed',
      transitionMaxLengthIn: 8 * FT, // IRC M1502.4.3
      nominalDiameterIn: 4, // IRC M1502.4.1
      minDuctThicknessIn: exhaustCode.code === 'IRC' && exhaustYear >= 2018 ? 0.0157 : 0.016, // IRC M1502.4.1
      terminationClearanceIn: 3 * FT, // IRC M1502.3; some states delete the clause by amendment
      fastenerMaxProtrusionIn: exhaustYear >= 2015 ? 0.125 : 0, // IRC M1502.4.2 (2015+); earlier: none
      // IRC M1502.4.2: supports every 12 ft from 2015; the IMC asks for every 4 ft.
      maxSupportSpacingIn: exhaustCode.code === 'IRC' ? (exhaustYear >= 2015 ? 12 * FT : null) : 4 * FT,
      minTerminalOpeningSqIn: exhaustCode.code === 'IRC' && exhaustYear >= 2018 ? 12.5 : null, // IRC 2018 M1502.3
      shieldPlateMinClearanceIn: 1.25, // IRC M1502.5
      boosterFanPolicy: exhaustYear >= 2021 ? 'power-ventilators-only' : 'listed-fans', // IRC 2021 M1502.4.5
    },
    makeupAir: {
      exhaustCfmThreshold: 200, // IMC 2015 504.5 / 2018 504.6
      closetOpeningMinSqIn: 100, // IMC 2015 504.5 / 2018 504.6
    },
    gas: {
      shutoffMaxDistanceIn: 6 * FT, // IRC G2420.5.1 / IFGC 409.5.1
      connectorMaxLengthIn: 6 * FT, // IRC G2422.1.2.1
    },
    electrical: {
      laundryCircuitMinAmps: 20, // NEC 210.11(C)(2)
      receptacleMaxDistanceIn: 6 * FT, // NEC 210.50(C)
      // NEC 210.8: laundry areas from 2014; 2020 reaches 250 V; 2023 adds dryer outlets, 210.8(D).
      gfciScope: nec >= 2023 ? 'laundry-and-dryer-outlets' : nec >= 2020 ? 'laundry-125-250v' : nec >= 2014 ? 'laundry-125v' : 'none',
      afciLaundry: nec >= 2014, // NEC 210.12(A)
      require4WireDryer: true, // NEC 250.140
      dryerCircuitMinAmps: 30, // common practice for a 5000 W (NEC 220.54) dryer at 240 V
    },
    plumbing: {
      standpipeMinIn: 18, // IRC P2706.2; IPC 802.4; UPC 804.1
      standpipeMaxIn: editions.plumbingFamily === 'UPC' ? 30 : 42,
      washerTrapMinIn: 2, // IRC Table P3201.7 (from memory)
      drainPanPolicy: 'never', // no model-code requirement; local amendments add one
      drainPanSection: null,
      leakShutoffPolicy: 'never',
      leakShutoffSection: null,
    },
    service: {
      removalMarginIn: 1, // common practice
      rearZoneMinIn: 6, // trade references; common practice
    },
    doors: {
      // Hinge makers' charts: 2 up to 1000 mm, 3 up to 1500, 4 up to 2000, 5 up to 2500.
      hingeCountChart: [
        { maxDoorHeightIn: mmToInches(1000), hinges: 2 },
        { maxDoorHeightIn: mmToInches(1500), hinges: 3 },
        { maxDoorHeightIn: mmToInches(2000), hinges: 4 },
        { maxDoorHeightIn: mmToInches(2500), hinges: 5 },
      ],
      hingeEdgeMinIn: mmToInches(60), // makers' guidance, 60-100 mm
      hingeEdgeMaxIn: mmToInches(100),
      // Common practice: a 35 mm cup hinge's arm and mounting plate stand about 37 mm behind the
      // door face at 90°; 2 in (51 mm) leaves a little more for knobs and a hand.
      hingeArmDepthIn: 2,
    },
    amendments: [], // model values: nothing amended
  };
}
