/**
 * Demo catalogue for the invented Kestrel Fluidics scenario (kestrel-fluidics.example): a small company
 * building lab dosing pumps and bench fans. Every maker, distributor and part number here is fictional.
 */
import type { PartCategory } from '../../../src/lib/domain/parts';
import { demoDiodes as diodeEntries } from './diodes';
import { demoDrivers as driverEntries } from './drivers';
import { demoMosfets as mosfetEntries } from './mosfets';
import { demoMotors as motorEntries } from './motors';
import type { AnyDemoPart, DemoDistributor, DemoEntry, DemoManufacturer, DemoPart } from './types';

export type { AnyDemoPart, DemoDistributor, DemoManufacturer, DemoPart } from './types';

/**
 * Invented pack sizes: Kelderhaus Bauteile cuts semiconductors from the reel in strips of ten, Fenwick Row
 * in strips of five; Ashdown and every motor sell singly. A source that states its own multiple keeps it.
 */
const PACK_OF: Record<string, number> = { 'Kelderhaus Bauteile': 10, 'Fenwick Row Electronics': 5 };

function withOrderMultiples<C extends PartCategory>(entries: DemoEntry<C>[]): DemoPart<C>[] {
  return entries.map(
    (e) =>
      ({
        ...e,
        sources: e.sources.map((s) => ({
          ...s,
          orderMultiple: s.orderMultiple ?? (e.category === 'motor' ? 1 : (PACK_OF[s.distributor] ?? 1)),
        })),
      }) as DemoPart<C>,
  );
}

export const demoMotors = withOrderMultiples(motorEntries);
export const demoMosfets = withOrderMultiples(mosfetEntries);
export const demoDrivers = withOrderMultiples(driverEntries);
export const demoDiodes = withOrderMultiples(diodeEntries);

export const demoCompany = {
  name: 'Kestrel Fluidics',
  domain: 'kestrel-fluidics.example',
  products: ['lab dosing pumps', 'bench fans'],
} as const;

export const demoManufacturers: DemoManufacturer[] = [
  {
    name: 'Calderwick Semiconductor',
    code: 'CW',
    website: 'https://calderwick-semi.example',
    categories: ['mosfet'],
    mpnPattern:
      'CW + channel (N/P) + VDS in volts + class (L logic-level, S standard-level) + 2-digit serial + "-" + package (S3 SOT-23, S32 SOT-323, C6 SC-70-6, S89 SOT-89, SO8 SOIC-8), e.g. CWN30L01-S3',
    mpnRegex: /^CW[NP]\d{2,3}[LS]\d{2}-(S3|S32|C6|S89|SO8)$/,
  },
  {
    name: 'Thornbury Power Devices',
    code: 'TBV',
    website: 'https://thornbury-power.example',
    categories: ['mosfet'],
    mpnPattern:
      'TBV + VDS in volts + channel (N/P) + RDS(on) max at 10 V in mΩ (3 digits) + "-" + package (Q DFN3333-8, K DPAK, T TO-220, S SOIC-8), e.g. TBV60N028-K',
    mpnRegex: /^TBV\d{2,3}[NP]\d{3}-[QKTS]$/,
  },
  {
    name: 'Marrowfield Microelectronics',
    code: 'MQ',
    website: 'https://marrowfield-micro.example',
    categories: ['mosfet', 'driver'],
    mpnPattern:
      'MOSFETs: MQ + channel (N/P) + VDS + T (low threshold) + 2-digit serial + "-" + package (S3, S32, C6, DF6 DFN2020-6), e.g. MQN20T06-S3; translators: MQL + bits + variant letter + "-" + package, e.g. MQL1A-S6',
    mpnRegex: /^(MQ[NP]\d{2}T\d{2}-(S3|S32|C6|DF6)|MQL\d[A-Z]-S\d)$/,
  },
  {
    name: 'Pellinor Analog',
    code: 'PLR',
    website: 'https://pellinor-analog.example',
    categories: ['driver'],
    mpnPattern:
      'PLR + channels + N (non-inverting) / I (inverting) + input (T TTL-level, C supply-ratio, L 1.8 V-compatible) + peak current ×10 + "-" + package (S5 SOT-23-5, S6 SOT-23-6, SO8 SOIC-8, DF6 DFN2020-6), e.g. PLR1NT15-S5',
    mpnRegex: /^PLR[12][NI][TCL]\d{2}-(S5|S6|SO8|DF6)$/,
  },
  {
    name: 'Ostler Rectifier Works',
    code: 'OR',
    website: 'https://ostler-rectifier.example',
    categories: ['diode'],
    mpnPattern:
      'OR + kind (S Schottky, U ultrafast, F fast, G general) + IF(AV)×10 + "-" + VRRM + "-" + package (D323, D123, MA SMA, MB SMB, A41 DO-41, A201 DO-201AD), e.g. ORS10-40-D123',
    mpnRegex: /^OR[SUFG]\d{2}-\d{2,4}-(D123|D323|MA|MB|A41|A201)$/,
  },
  {
    name: 'Haverleigh Motion',
    code: 'HVM',
    website: 'https://haverleigh-motion.example',
    categories: ['motor'],
    mpnPattern:
      'HVM- + frame size (3 digits) + P (pump) / F (fan) + "-" + rated voltage ×10 (3 digits) + winding letter, e.g. HVM-260P-060A',
    mpnRegex: /^HVM-\d{3}[PF]-\d{3}[A-Z]$/,
  },
  {
    name: 'Brisling Micromotors',
    code: 'BRM',
    website: 'https://brisling-micromotors.example',
    categories: ['motor'],
    mpnPattern: 'BRM + diameter mm + length mm + "-" + rated voltage ×10 (3 digits) + variant (G = with gearhead), e.g. BRM2430-120C',
    mpnRegex: /^BRM\d{4}-\d{3}[A-Z]$/,
  },
];

export const demoDistributors: DemoDistributor[] = [
  {
    name: 'Fenwick Row Electronics',
    website: 'https://fenwick-row.example',
    currency: 'USD',
    skuPattern: 'FRE- + 6 digits, e.g. FRE-530996',
    skuRegex: /^FRE-\d{6}$/,
  },
  {
    name: 'Ashdown Component Supply',
    website: 'https://ashdown-supply.example',
    currency: 'USD',
    skuPattern: 'ACS- + the maker part number, e.g. ACS-HVM-260P-060A',
    skuRegex: /^ACS-[A-Z0-9-]+$/,
  },
  {
    name: 'Kelderhaus Bauteile',
    website: 'https://kelderhaus-bauteile.example',
    currency: 'EUR',
    skuPattern: 'KB- + 3 digits + "-" + 4 digits, e.g. KB-412-7305',
    skuRegex: /^KB-\d{3}-\d{4}$/,
  },
];

/** The whole demo catalogue in one list (motors, MOSFETs, drivers, diodes). */
export const demoParts: AnyDemoPart[] = [...demoMotors, ...demoMosfets, ...demoDrivers, ...demoDiodes];
