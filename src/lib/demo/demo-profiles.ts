import type { EventKind, Instrument, RecordTables } from '../domain';

export const MAS_LABELS = ['0', '1', '1+', '2', '3', '4'] as const;

export interface RomPlan {
  readonly site: string;
  readonly baseline: readonly [number, number];
  readonly instrument: Instrument;
}
export interface Profile {
  readonly condition: RecordTables['patients']['condition'];
  readonly bilateral: boolean;
  readonly mas: readonly string[];
  readonly tardieu: readonly string[];
  readonly rom: readonly RomPlan[];
  readonly pendulum: boolean;
  readonly spasms: boolean;
  readonly interventions: readonly EventKind[];
  readonly toxinMuscles: string;
  readonly toxinSites: readonly string[];
}

/** Six invented caseload profiles, cycled over the patients. */
export const PROFILES: readonly Profile[] = [
  {
    condition: 'stroke', bilateral: false, mas: ['elbow-flexors', 'wrist-flexors', 'ankle-plantarflexors'], tardieu: ['elbow-flexors'],
    rom: [{ site: 'elbow-extension', baseline: [-30, -8], instrument: 'universal-goniometer' }, { site: 'wrist-extension', baseline: [0, 35], instrument: 'universal-goniometer' }],
    pendulum: false, spasms: false, interventions: ['botulinum-toxin-injection', 'therapy-block-start'],
    toxinMuscles: 'biceps brachii, brachioradialis, flexor carpi radialis', toxinSites: ['elbow-flexors', 'wrist-flexors'],
  },
  {
    condition: 'stroke', bilateral: false, mas: ['ankle-plantarflexors', 'knee-extensors'], tardieu: ['ankle-gastrocnemius'],
    rom: [{ site: 'ankle-dorsiflexion', baseline: [-12, 6], instrument: 'universal-goniometer' }],
    pendulum: false, spasms: false, interventions: ['botulinum-toxin-injection', 'orthosis'],
    toxinMuscles: 'gastrocnemius (medial and lateral heads), soleus', toxinSites: ['ankle-plantarflexors', 'ankle-gastrocnemius'],
  },
  {
    condition: 'multiple-sclerosis', bilateral: true, mas: ['knee-extensors', 'hip-adductors', 'ankle-plantarflexors'], tardieu: [],
    rom: [{ site: 'knee-extension', baseline: [-15, 0], instrument: 'inclinometer' }],
    pendulum: true, spasms: true, interventions: ['oral-medication-change', 'therapy-block-start'], toxinMuscles: '', toxinSites: [],
  },
  {
    condition: 'spinal-cord-injury', bilateral: true, mas: ['knee-extensors', 'ankle-plantarflexors', 'hip-adductors'], tardieu: ['knee-extensors'],
    rom: [{ site: 'hip-abduction', baseline: [15, 35], instrument: 'universal-goniometer' }],
    pendulum: true, spasms: true, interventions: ['intrathecal-pump-change'], toxinMuscles: '', toxinSites: [],
  },
  {
    condition: 'acquired-brain-injury', bilateral: false, mas: ['ankle-plantarflexors', 'elbow-flexors'], tardieu: ['ankle-soleus'],
    rom: [{ site: 'ankle-dorsiflexion', baseline: [-20, -2], instrument: 'universal-goniometer' }],
    pendulum: false, spasms: false, interventions: ['serial-casting', 'orthosis'], toxinMuscles: '', toxinSites: [],
  },
  {
    condition: 'cerebral-palsy', bilateral: true, mas: ['knee-flexors', 'ankle-plantarflexors'], tardieu: ['knee-flexors'],
    rom: [{ site: 'knee-extension', baseline: [-25, -5], instrument: 'universal-goniometer' }, { site: 'ankle-dorsiflexion', baseline: [-10, 8], instrument: 'phone-sensor' }],
    pendulum: false, spasms: false, interventions: ['botulinum-toxin-injection', 'therapy-block-start', 'surgery'],
    toxinMuscles: 'medial hamstrings', toxinSites: ['knee-flexors'],
  },
];


export const TARDIEU_FULL_RANGE_DEG: Readonly<Record<string, number>> = {
  'elbow-flexors': 145, 'wrist-flexors': 140, 'knee-flexors': 120, 'knee-extensors': 130, 'ankle-gastrocnemius': 65, 'ankle-soleus': 70, 'hip-adductors': 45,
};

