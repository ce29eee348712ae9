// The rates form keeps what the admin types (dollars, percents, hours, 24-hour times); these turn
// it into the rates payload (cents, basis points, tenths, minutes) and back.
import type { RatesInput } from '#shared/schemas/rates'

export type RatesRow = Required<Omit<RatesInput, 'shopSuppliesCapCents'>> & { shopSuppliesCapCents: number | null, effectiveFrom: string }

export const RATE_WEEKDAYS = [[1, 'Mon'], [2, 'Tue'], [3, 'Wed'], [4, 'Thu'], [5, 'Fri'], [6, 'Sat'], [7, 'Sun']] as const
export const RATE_TAXED_KINDS = [
  ['laborTaxable', 'Labor and the road-call minimum'], ['travelTaxable', 'Travel'], ['partsTaxable', 'Parts'],
  ['coresTaxable', 'Core charges'], ['feesTaxable', 'Shop supplies and fees'],
] as const

const money = (c: number | null | undefined) => (c == null ? '' : (c / 100).toFixed(2))
const hhmm = (m: number) => `${String(Math.floor(m / 60)).padStart(2, '0')}:${String(m % 60).padStart(2, '0')}`
function scaled(t: string, by: number) {
  const n = numberFromText(t)
  return n === null || Number.isNaN(n) ? n : Math.round(n * by)
}

/** "07:30" → 450; "24:00" → 1440; anything else → NaN so the schema names the field. */
export function minuteFromText(t: string): number {
  const m = /^\s*(\d{1,2})(?::(\d{2}))?\s*$/.exec(t)
  if (!m) return Number.NaN
  const h = Number(m[1]), min = Number(m[2] ?? 0)
  return h <= 24 && min < 60 && h * 60 + min <= 1440 ? h * 60 + min : Number.NaN
}

export function ratesToForm(r: RatesRow | null | undefined) {
  return {
    labor: money(r?.laborCentsPerHour), afterHours: String(r?.afterHoursMultiplierPct ?? 150),
    minimumHours: r ? (r.minimumLaborTenths / 10).toFixed(1) : '1.0', roadCallMinimum: money(r?.roadCallMinimumCents),
    travelBasis: r?.travelBasis ?? 'distance', travel: money(r?.travelCentsPerUnit), travelUnit: r?.travelUnit ?? 'km',
    travelHour: money(r?.travelCentsPerHour), roadFactor: ((r?.roadFactorPct ?? 130) / 100).toFixed(2),
    markup: String(r?.partsMarkupPct ?? 0), tax: r ? (r.taxRateBasisPoints / 100).toFixed(2) : '0', kph: String(r?.averageRoadKph ?? 70),
    laborTaxable: r?.laborTaxable ?? false, travelTaxable: r?.travelTaxable ?? false, partsTaxable: r?.partsTaxable ?? true,
    coresTaxable: r?.coresTaxable ?? false, feesTaxable: r?.feesTaxable ?? false,
    supplies: r ? (r.shopSuppliesBasisPoints / 100).toFixed(2) : '0', suppliesCap: money(r?.shopSuppliesCapCents),
    envFee: money(r?.environmentalFeeCents ?? 0),
    timeZone: r?.timeZone ?? 'UTC', open: hhmm(r?.openMinute ?? 0), close: hhmm(r?.closeMinute ?? 1440),
    openDays: [...(r?.openDays ?? [1, 2, 3, 4, 5, 6, 7])], holidays: (r?.holidays ?? []).join('\n'),
    businessName: r?.businessName ?? '', businessPhone: r?.businessPhone ?? '',
    businessEmail: r?.businessEmail ?? '', remitAddress: r?.remitAddress ?? '',
    statusLinkDays: String(r?.statusLinkDays ?? 14), alarmMinutes: String(r?.assignmentAlarmMinutes ?? 10),
  }
}
export type RatesForm = ReturnType<typeof ratesToForm>

export function ratesFromForm(f: RatesForm) {
  return {
    laborCentsPerHour: centsFromText(f.labor), afterHoursMultiplierPct: numberFromText(f.afterHours),
    minimumLaborTenths: scaled(f.minimumHours, 10),
    roadCallMinimumCents: centsFromText(f.roadCallMinimum), travelBasis: f.travelBasis, travelCentsPerUnit: centsFromText(f.travel),
    travelUnit: f.travelUnit, travelCentsPerHour: centsFromText(f.travelHour || '0'), roadFactorPct: scaled(f.roadFactor, 100),
    partsMarkupPct: numberFromText(f.markup), taxRateBasisPoints: scaled(f.tax, 100), averageRoadKph: numberFromText(f.kph),
    laborTaxable: f.laborTaxable, travelTaxable: f.travelTaxable, partsTaxable: f.partsTaxable,
    coresTaxable: f.coresTaxable, feesTaxable: f.feesTaxable, shopSuppliesBasisPoints: scaled(f.supplies || '0', 100),
    shopSuppliesCapCents: f.suppliesCap.trim() ? centsFromText(f.suppliesCap) : null,
    environmentalFeeCents: centsFromText(f.envFee || '0'), timeZone: f.timeZone.trim(),
    openMinute: minuteFromText(f.open), closeMinute: minuteFromText(f.close), openDays: [...f.openDays].sort(),
    holidays: f.holidays.split(/[\s,]+/).filter(Boolean), businessName: f.businessName, businessPhone: f.businessPhone,
    businessEmail: f.businessEmail, remitAddress: f.remitAddress, statusLinkDays: numberFromText(f.statusLinkDays),
    assignmentAlarmMinutes: numberFromText(f.alarmMinutes),
  }
}
