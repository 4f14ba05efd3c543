export * from '@/lib/domain/sizing/enclosure';
export * from '@/lib/domain/sizing/doors';
export * from '@/lib/domain/sizing/rounding';
