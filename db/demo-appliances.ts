// The demo appliance catalog: invented models for the demo company, marked demo. Their figures follow the
// usual ranges (TRADE.md "unit sizes" and "maker's closet clearances", secondary sources; closet vents
// 48 + 24 sq in as makers' instructions typically ask); exhaust flows and ratings are from memory.
import type { ApplianceModelValues } from '@/lib/domain/appliances/model';

const none = {
  frontProjectionIn: null, clearanceSideIn: null, clearanceTopIn: null, clearanceRearIn: null, clearanceFrontIn: null,
  closetVentTopSqIn: null, closetVentBottomSqIn: null, maxExhaustLengthIn: null, fuel: null, dryerType: null, exhaustCfm: null,
  volts: null, amps: null,
} as const;

const closet = { clearanceSideIn: 1, clearanceTopIn: 1, clearanceFrontIn: 1 } as const;

export const demoApplianceModels: ApplianceModelValues[] = [
  { ...none, ...closet, kind: 'washer', label: 'Demo FL-27 front-load washer (demo)', widthIn: 27, depthIn: 32, heightIn: 39, frontProjectionIn: 2.5, clearanceRearIn: 4, volts: 120, amps: 15 },
  { ...none, ...closet, kind: 'washer', label: 'Demo HW-24 hall-closet washer (demo)', widthIn: 24, depthIn: 24, heightIn: 34, frontProjectionIn: 2, clearanceRearIn: 4, volts: 120, amps: 15 },
  { ...none, ...closet, kind: 'washer', label: 'Demo CW-24 compact washer (demo)', widthIn: 24, depthIn: 24.5, heightIn: 34, frontProjectionIn: 2, clearanceRearIn: 4, volts: 120, amps: 15 },
  {
    ...none, ...closet, kind: 'dryer', label: 'Demo ED-27 electric dryer (demo)', widthIn: 27, depthIn: 31, heightIn: 39, frontProjectionIn: 2.5,
    clearanceRearIn: 5.5, closetVentTopSqIn: 48, closetVentBottomSqIn: 24, maxExhaustLengthIn: 420, fuel: 'electric', dryerType: 'vented', exhaustCfm: 180, volts: 240, amps: 30,
  },
  {
    ...none, ...closet, kind: 'dryer', label: 'Demo HD-24 hall-closet electric dryer (demo)', widthIn: 24, depthIn: 24, heightIn: 34, frontProjectionIn: 2,
    clearanceRearIn: 4, closetVentTopSqIn: 48, closetVentBottomSqIn: 24, fuel: 'electric', dryerType: 'vented', exhaustCfm: 160, volts: 240, amps: 30,
  },
  {
    ...none, ...closet, kind: 'dryer', label: 'Demo GD-27 gas dryer (demo)', widthIn: 27, depthIn: 31, heightIn: 39, frontProjectionIn: 2.5,
    clearanceRearIn: 6, closetVentTopSqIn: 48, closetVentBottomSqIn: 24, maxExhaustLengthIn: 360, fuel: 'gas', dryerType: 'vented', exhaustCfm: 190, volts: 120, amps: 15,
  },
  {
    ...none, ...closet, kind: 'dryer', label: 'Demo CD-24 compact condensing dryer (demo)', widthIn: 24, depthIn: 24.5, heightIn: 34, frontProjectionIn: 2,
    clearanceRearIn: 4, fuel: 'electric', dryerType: 'condensing', volts: 240, amps: 20,
  },
  {
    ...none, ...closet, kind: 'dryer', label: 'Demo HP-24 heat-pump dryer (demo)', widthIn: 24, depthIn: 25, heightIn: 34, frontProjectionIn: 2,
    clearanceRearIn: 4, fuel: 'electric', dryerType: 'heat-pump', volts: 120, amps: 15,
  },
  {
    ...none, ...closet, kind: 'washer-dryer', label: 'Demo AIO-24 washer-dryer combination (demo)', widthIn: 24, depthIn: 25, heightIn: 34, frontProjectionIn: 2,
    clearanceRearIn: 4, fuel: 'electric', dryerType: 'heat-pump', volts: 120, amps: 15,
  },
];
