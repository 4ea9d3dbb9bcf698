import { findMeasure } from '$lib/domain';

// How the reliability page writes sites, figures and units.

export const siteLabel = (measureCode: string, siteCode: string) => findMeasure(measureCode)?.sites.find((s) => s.code === siteCode)?.label ?? siteCode;
export const fmt = (v: number, d = 3) => (Number.isFinite(v) ? v.toFixed(d) : '–');
export const unit = (measureCode: string) => (findMeasure(measureCode)?.unit === 'deg' ? '°' : '');
