// Every rule-of-thumb threshold in one typed object, so a block can override it later (stored as
// JSON beside the block) without touching code. Each default says where it comes from.
import { BALANCED_PRUNING_FORMULAS, validateFormula, type BalancedPruningFormula } from './pruning';

export interface BudRange {
  readonly min: number;
  readonly max: number;
}

export interface ViticultureSettings {
  readonly canes: {
    /** Below this base diameter a cane is not worth keeping at all. */
    readonly veryThinBelowMm: number;
    /**
     * Below this a cane is thin: usable only if nothing better, and given the thin bud band. One
     * limit for both judgements (assessCane and recommendedBudsPerCane).
     */
    readonly thinBelowMm: number;
    /** Above this a cane is a bull cane: over-vigorous, poorly fruitful, a poor choice to keep. */
    readonly bullAboveMm: number;
    /** The thickness canes are ranked against when a plan picks the best ones. */
    readonly idealMm: number;
    /** A longest internode above this marks a shade cane. */
    readonly shadeInternodeAboveMm: number;
    /** This many minor faults together make a cane one to remove. */
    readonly minorFaultsToRemove: number;
  };
  readonly budsPerCane: {
    /** From this base diameter up to canes.bullAboveMm a cane counts as thick (vigorous, not a bull cane). */
    readonly thickFromMm: number;
    readonly thin: BudRange;
    readonly normal: BudRange;
    readonly thick: BudRange;
  };
  readonly plan: {
    /** Fruit canes a cane-pruned vine keeps when there is no bud target. */
    readonly canesPerVine: number;
    /** Most fruit canes a plan may keep while chasing a bud target. */
    readonly maxCanesPerVine: number;
    /** Renewal spurs per kept cane (rounded up over the vine). */
    readonly renewalSpursPerCane: number;
    readonly budsPerRenewalSpur: number;
    /** Spurs a spur-pruned vine keeps when there is no bud target. */
    readonly spursPerVine: number;
    readonly budsPerSpur: number;
    /** Most buds a fruiting spur may keep while chasing a bud target. */
    readonly maxBudsPerSpur: number;
    /** Least room along a cordon for one spur: caps the spur count where the cordon length is known. */
    readonly minSpurSpacingMm: number;
  };
  readonly budLoad: {
    /** Buds per foot of row (vine spacing) a balanced vine usually carries: the low end. */
    readonly minBudsPerFt: number;
    /** The high end; a target above it is flagged. */
    readonly maxBudsPerFt: number;
  };
  readonly pruning: {
    /** Used when a pruning weight comes without a formula (a block sets its grape type here). */
    readonly formula: BalancedPruningFormula;
  };
  readonly budbreak: {
    /** Budbreak under this percentage is weak. */
    readonly weakBelowPercent: number;
    /** Under this it is poor. */
    readonly poorBelowPercent: number;
    /** Under this the vine has all but failed to push. */
    readonly failedBelowPercent: number;
  };
  readonly budInjury: {
    /** From this primary bud kill, leave that percentage more buds. */
    readonly extraFromPercent: number;
    /** Above this, prune minimally or wait until budbreak. */
    readonly minimalAbovePercent: number;
  };
  readonly ravaz: {
    /** A Ravaz index below this reads as under-cropped. */
    readonly underBelow: number;
    /** Above this it reads as over-cropped. */
    readonly overAbove: number;
  };
  /** The same reading for Concord and the Concord-type "American" grapes, whose balanced vines carry more. */
  readonly ravazAmerican: {
    readonly underBelow: number;
    readonly overAbove: number;
  };
  readonly trunkInjury: {
    /** Girdling above this share of the circumference needs action. */
    readonly actAbovePercent: number;
    /** Above this the trunk is likely lost without renewal: urgent. */
    readonly urgentAbovePercent: number;
  };
  readonly caneInjury: {
    /** Severe injury on this many canes or more is urgent. */
    readonly urgentFromCanes: number;
  };
  readonly pruningRecord: {
    /** Deviation of retained buds from the target, in percent of the target. */
    readonly fineWithinPercent: number;
    readonly watchWithinPercent: number;
    readonly actWithinPercent: number;
  };
  readonly crop: {
    /** Clusters on a shoot, for a crop estimate made before clusters are counted. */
    readonly clustersPerShoot: number;
    /** Cluster weight at harvest in grams, until the block's own weights are known. */
    readonly clusterWeightG: number;
    /** Harvest cluster weight over lag-phase cluster weight. */
    readonly lagPhaseMultiplier: number;
    /** Coefficient of variation of yield per vine, in percent, until the block's own yields give one. */
    readonly yieldCvPercent: number;
    /** Margin of a crop estimate's mean yield per vine, in percent of the mean, that sizes its sample. */
    readonly sampleMarginPercent: number;
    /** A replant is counted as bearing from this many seasons after its planting year. */
    readonly bearingAfterSeasons: number;
  };
  readonly labour: {
    /** Hand-pruning minutes per vine on a spur-pruned block. */
    readonly spurMinutesPerVine: number;
    /** On a cane-pruned block: the slower, costlier kind (canes pulled out of the wires and tied down). */
    readonly caneMinutesPerVine: number;
    /** Cost of one hour of pruning, in whatever currency the estate uses. */
    readonly hourlyCost: number;
  };
}

export type SettingsOverride = {
  readonly [G in keyof ViticultureSettings]?: Partial<ViticultureSettings[G]>;
};

export const DEFAULT_SETTINGS: ViticultureSettings = deepFreeze<ViticultureSettings>({
  canes: {
    // 3/16 in. Common practice, no source.
    veryThinBelowMm: 4.8,
    // 5/16 in: F. Westover, Wines & Vines, May 2016 ("The ideal range of acceptable, fruitful wood
    // for spurs and canes is between 5/16 and a half inch in diameter"). Garden sources allow
    // 1/4 in (grovida.us "1/4 inch or more"; Yuma Sun 2022 "1/4-1/2 inch"): a block may set 6.35.
    thinBelowMm: 7.9375,
    // 1/2 in: eXtension, "What are 'bull' canes and how do I handle them?" (bull canes have "large
    // diameter (greater than ½ inch)"); also the top of Westover's range.
    bullAboveMm: 12.7,
    // 3/8 in, the middle of that published 1/4–1/2 in range ("about pencil thickness").
    idealMm: 9.525,
    // 6 in. eXtension's bull-cane page gives "very long internodes (5-6 inches or more)" as the sign of
    // an over-vigorous shoot; the Oxford Companion to Wine (2006) puts cuttings at 50–150 mm and
    // grovida.us leaves "about 6 inches" apart on table grapes. Longer than 6 in is the shade or
    // excess-vigour sign; 4–6 in (102–152 mm) is an ordinary cane.
    shadeInternodeAboveMm: 152.4,
    // Common practice, no source.
    minorFaultsToRemove: 2,
  },
  budsPerCane: {
    // 7/16 in: one sixteenth above 3/8 in. Common practice, no source. Thin is canes.thinBelowMm.
    thickFromMm: 11.1125,
    // Common practice, no source; poorly ripened canes may carry only 6–8 nodes (grovida.us).
    thin: { min: 8, max: 10 },
    // Yuma Sun 2022 ("leaving 12-15 buds"); 12–14 is the product brief's figure.
    normal: { min: 12, max: 14 },
    // Common practice, no source (the product brief's 16–18); canes run 10–20 nodes in the Midwest
    // Grape Production Guide (OSU B919).
    thick: { min: 16, max: 18 },
  },
  plan: {
    // Two canes (double Guyot, bilateral cane): from memory.
    canesPerVine: 2,
    // Four-cane Kniffin keeps four canes (UT PB1475 contents; low authority).
    maxCanesPerVine: 4,
    // One renewal spur per cane; one and a half is also common. Common practice, no source.
    renewalSpursPerCane: 1,
    // "Renewal spur is 1 to 2 nodes long" (Midwest Grape Production Guide, OSU B919); Yuma Sun 2022:
    // "only two buds".
    budsPerRenewalSpur: 2,
    // Common practice, no source; 24 buds sits inside Ohio State's 20–50 buds per vine check for
    // 5–8 ft vine spacing (2023 primer).
    spursPerVine: 12,
    // Oxford Companion to Wine (2006), "spur pruning": spurs "retain only two buds".
    budsPerSpur: 2,
    // Common practice, no source; OSU B919 allows spurs of 2 to 6 nodes.
    maxBudsPerSpur: 4,
    // 3 in: A. Klodd, University of Minnesota Extension (Grapevine Magazine, Nov 2022): "one spur every
    // 3-5 inches" along the cordon; the close end, so only a crowded plan is cut back.
    minSpurSpacingMm: 76.2,
  },
  budLoad: {
    // Ohio State, "2023 Grape Pruning Primer" (M. Smith): "approximately 4-6 buds per foot of vine
    // spacing (e.g., if the vine spacing is 5-8', retain 20-50 buds per vine)".
    minBudsPerFt: 4,
    maxBudsPerFt: 6,
  },
  pruning: {
    // Ohio State 2023 primer, "Vinifera 20 + 20".
    formula: BALANCED_PRUNING_FORMULAS.vinifera,
  },
  budbreak: {
    // No published threshold exists (check-values §5). Common practice, no source.
    weakBelowPercent: 75,
    poorBelowPercent: 50,
    failedBelowPercent: 20,
  },
  budInjury: {
    // Cornell Northern New York Grape Update, "Evaluating bud injury and adjusting pruning"
    // (28 Feb 2014): "if <20% of buds are injured, you don't need to leave extra buds".
    extraFromPercent: 20,
    // Purdue, Facts for Fancy Fruit, "Double pruning grapevines": ">50% bud damage- Minimally prune";
    // the table-grape guide (grovida.us, MSU): "greater than 50% ... delay pruning until after bud
    // break". Cornell's linear rule runs to 80%; past half the buds dead the two agree it is no longer
    // a matter of counting.
    minimalAbovePercent: 50,
  },
  ravaz: {
    // Wines & Vines, June 2017: "the optimum Ravaz Index ... can range from 5 to 10" (vinifera).
    underBelow: 5,
    overAbove: 10,
  },
  ravazAmerican: {
    // T. Bates, Cornell LERGP, "Vine Size: Magic Number 15": "a Ravaz Index > 20 ... overcropped",
    // "< 10 ... undercropped" (Concord).
    underBelow: 10,
    overAbove: 20,
  },
  trunkInjury: {
    // Common practice, no source: past half the circumference the trunk is usually renewed.
    actAbovePercent: 25,
    urgentAbovePercent: 50,
  },
  caneInjury: {
    // Common practice, no source: a two-cane vine with three badly hurt canes has no good spare.
    urgentFromCanes: 3,
  },
  pruningRecord: {
    // Common practice, no source.
    fineWithinPercent: 10,
    watchWithinPercent: 25,
    actWithinPercent: 50,
  },
  crop: {
    // From memory: fruitful vinifera shoots carry one to two clusters.
    clustersPerShoot: 1.5,
    // From memory: wine-grape clusters run from about 50 g to over 250 g by variety and season, so
    // every block should enter its own; 100 g is a middling wine-grape cluster.
    clusterWeightG: 100,
    // J. Fiola, University of Maryland Extension, "Crop Estimation": "cluster weights will double from
    // lag phase to harvest", adding that "this multiplier is not a fixed number": set the block's own.
    lagPhaseMultiplier: 2,
    // From memory (Wolpert & Vilas, AJEV Technical Brief, 1992: their worked figures were not read): vine
    // yields commonly vary with a CV near 30%. The Strickland (1932) uniformity trial at Rutherglen had
    // a CV of 43.4% (agridat documentation), so measure the block's own when you can.
    yieldCvPercent: 30,
    // ±10%: BC Wine Grape Council best-practice guide, "a good estimate will not vary by more than 10%".
    sampleMarginPercent: 10,
    // Common practice, no source: a replant carries its first real crop in its third leaf.
    bearingAfterSeasons: 2,
  },
  labour: {
    // Common practice, no source. Martinson & Vanden Heuvel (Cornell, "Training systems and Labor"):
    // each minute per vine is 13.5 hours per acre at 807 vines/acre.
    spurMinutesPerVine: 1,
    // From memory: cane pruning takes about 1.5 to 2 times the hours of spur pruning; 1.75 is the middle.
    caneMinutesPerVine: 1.75,
    // No source: a placeholder, since every crew's rate differs; set your own.
    hourlyCost: 25,
  },
});

/**
 * Defaults with `partial` laid over them, group by group, then checked: a stored override that makes
 * no sense (negative, out of order) throws a RangeError naming the key instead of silently skewing
 * every judgement on the block.
 */
export function mergeSettings(partial: SettingsOverride = {}): ViticultureSettings {
  const merged: Record<string, Record<string, unknown>> = {};
  for (const [group, defaults] of Object.entries(DEFAULT_SETTINGS)) merged[group] = { ...defaults };
  for (const [group, values] of Object.entries(partial as Record<string, Record<string, unknown> | undefined>)) {
    if (!(group in merged)) throw new RangeError(`unknown settings group '${group}'`);
    for (const [key, value] of Object.entries(values ?? {})) {
      if (!(key in merged[group]!)) throw new RangeError(`unknown setting '${group}.${key}'`);
      // Left-out keys in a stored override come back as undefined; they mean "use the default".
      // Copied, so freezing the result never freezes an object the caller still holds.
      if (value !== undefined) merged[group]![key] = value !== null && typeof value === 'object' ? { ...value } : value;
    }
  }
  const settings = merged as unknown as ViticultureSettings;
  validateSettings(settings);
  checked.add(settings);
  return deepFreeze(settings);
}

// Results of mergeSettings, so passing one back in (as planVine does per cane) skips the checks.
const checked = new WeakSet<object>([DEFAULT_SETTINGS]);

/** Settings as the calculations take them: left out means the defaults, no re-checking. */
export function resolveSettings(settings: SettingsOverride | undefined): ViticultureSettings {
  if (settings === undefined) return DEFAULT_SETTINGS;
  return checked.has(settings) ? (settings as ViticultureSettings) : mergeSettings(settings);
}

function validateSettings(s: ViticultureSettings): void {
  for (const [group, values] of Object.entries(s)) {
    for (const [key, value] of Object.entries(values as Record<string, unknown>)) {
      if (typeof value === 'number') {
        if (!Number.isFinite(value) || value < 0) {
          throw new RangeError(`settings.${group}.${key} must be a finite number of 0 or more, got ${String(value)}`);
        }
      } else if (key !== 'formula') {
        const range = value as BudRange;
        if (!isRange(range)) {
          throw new RangeError(`settings.${group}.${key} must be { min, max } whole numbers with min <= max`);
        }
      }
    }
  }
  validateFormula(s.pruning.formula);
  ascending('canes', ['veryThinBelowMm', 'thinBelowMm', 'bullAboveMm'], s.canes);
  ascending('canes', ['thinBelowMm', 'idealMm', 'bullAboveMm'], s.canes);
  if (s.budsPerCane.thickFromMm < s.canes.thinBelowMm || s.budsPerCane.thickFromMm > s.canes.bullAboveMm) {
    throw new RangeError('settings: canes.thinBelowMm <= budsPerCane.thickFromMm <= canes.bullAboveMm must hold');
  }
  ascending('budLoad', ['minBudsPerFt', 'maxBudsPerFt'], s.budLoad);
  if (s.crop.lagPhaseMultiplier < 1) throw new RangeError('settings.crop.lagPhaseMultiplier must be at least 1: clusters do not shrink to harvest');
  if (s.crop.sampleMarginPercent <= 0) throw new RangeError('settings.crop.sampleMarginPercent must be greater than 0');
  ascending('plan', ['canesPerVine', 'maxCanesPerVine'], s.plan);
  ascending('plan', ['budsPerSpur', 'maxBudsPerSpur'], s.plan);
  ascending('budbreak', ['failedBelowPercent', 'poorBelowPercent', 'weakBelowPercent'], s.budbreak);
  ascending('budInjury', ['extraFromPercent', 'minimalAbovePercent'], s.budInjury);
  ascending('ravaz', ['underBelow', 'overAbove'], s.ravaz);
  ascending('ravazAmerican', ['underBelow', 'overAbove'], s.ravazAmerican);
  ascending('trunkInjury', ['actAbovePercent', 'urgentAbovePercent'], s.trunkInjury);
  ascending('pruningRecord', ['fineWithinPercent', 'watchWithinPercent', 'actWithinPercent'], s.pruningRecord);
  ascending('labour', ['spurMinutesPerVine', 'caneMinutesPerVine'], s.labour);
  if (!Number.isInteger(s.crop.bearingAfterSeasons)) throw new RangeError('settings.crop.bearingAfterSeasons must be a whole number');
  for (const key of ['canesPerVine', 'maxCanesPerVine', 'spursPerVine', 'budsPerSpur', 'maxBudsPerSpur', 'budsPerRenewalSpur'] as const) {
    if (!Number.isInteger(s.plan[key])) throw new RangeError(`settings.plan.${key} must be a whole number`);
  }
  if (s.plan.canesPerVine < 1 || s.plan.budsPerSpur < 1) {
    throw new RangeError('settings.plan.canesPerVine and budsPerSpur must be at least 1');
  }
  if (s.budbreak.weakBelowPercent > 100 || s.budInjury.minimalAbovePercent > 100 || s.trunkInjury.urgentAbovePercent > 100) {
    throw new RangeError('percent settings must not exceed 100');
  }
}

function isRange(value: BudRange): boolean {
  return value !== null && typeof value === 'object' && Number.isInteger(value.min) && Number.isInteger(value.max) && value.min >= 0 && value.min <= value.max;
}

function ascending<G extends keyof ViticultureSettings>(group: G, keys: string[], values: ViticultureSettings[G]): void {
  const numbers = keys.map((key) => (values as Record<string, number>)[key]);
  for (let i = 1; i < numbers.length; i++) {
    if (numbers[i - 1]! > numbers[i]!) {
      throw new RangeError(`settings.${group}: ${keys.join(' <= ')} must hold, got ${numbers.join(', ')}`);
    }
  }
}

function deepFreeze<T>(value: T): T {
  if (value !== null && typeof value === 'object' && !Object.isFrozen(value)) {
    for (const inner of Object.values(value)) deepFreeze(inner);
    Object.freeze(value);
  }
  return value;
}

/** One setting's name as stored and shown: `group.key`, e.g. `canes.bullAboveMm`. */
export type SettingKey = {
  [G in keyof ViticultureSettings]: `${G & string}.${keyof ViticultureSettings[G] & string}`;
}[keyof ViticultureSettings];

export interface SettingMeta {
  readonly label: string;
  /** The unit the value is stored and typed in. */
  readonly unit: string;
  /** Where the default comes from, as the code comment above it says. */
  readonly source: string;
  /** The smallest change that means something: the form's step and the mutation check's step. */
  readonly step: number;
  /** 'range' is { min, max } whole numbers; 'formula' is { firstUnitBuds, perAdditionalUnitBuds, unit }. */
  readonly kind: 'number' | 'integer' | 'range' | 'formula';
}

const NO_SOURCE = 'Common practice, no source.';
const m = (label: string, unit: string, step: number, source: string, kind: SettingMeta['kind'] = 'number'): SettingMeta => ({
  label,
  unit,
  step,
  source,
  kind,
});

/** Every setting with its unit and the named source of its default, in the order the screen shows them. */
export const SETTINGS_META: Readonly<Record<SettingKey, SettingMeta>> = Object.freeze({
  'canes.veryThinBelowMm': m('Very thin cane below', 'mm', 0.1, `3/16 in. ${NO_SOURCE}`),
  'canes.thinBelowMm': m(
    'Thin cane below',
    'mm',
    0.1,
    'F. Westover, Wines & Vines, May 2016: fruitful wood "between 5/16 and a half inch in diameter" (5/16 in). Garden sources allow 1/4 in (6.35 mm).',
  ),
  'canes.bullAboveMm': m(
    'Bull cane above',
    'mm',
    0.1,
    'eXtension, "What are \'bull\' canes and how do I handle them?": "large diameter (greater than ½ inch)" (1/2 in).',
  ),
  'canes.idealMm': m('Ideal cane diameter', 'mm', 0.1, '3/8 in, the middle of the published 1/4–1/2 in range ("about pencil thickness").'),
  'canes.shadeInternodeAboveMm': m(
    'Shade cane: longest internode above',
    'mm',
    1,
    'eXtension bull-cane page: "very long internodes (5-6 inches or more)" (6 in); 4–6 in is an ordinary cane (Purdue).',
  ),
  'canes.minorFaultsToRemove': m('Minor faults that make a cane one to remove', 'faults', 1, NO_SOURCE, 'integer'),
  'budsPerCane.thickFromMm': m('Thick cane from', 'mm', 0.1, `7/16 in. ${NO_SOURCE}`),
  'budsPerCane.thin': m('Buds on a thin cane', 'buds', 1, 'Common practice, no source; poorly ripened canes may carry only 6–8 nodes (grovida.us).', 'range'),
  'budsPerCane.normal': m('Buds on a normal cane', 'buds', 1, 'Yuma Sun 2022: "leaving 12-15 buds"; 12–14 is the product brief\'s figure.', 'range'),
  'budsPerCane.thick': m(
    'Buds on a thick cane',
    'buds',
    1,
    'Common practice, no source; canes run 10–20 nodes (Midwest Grape Production Guide, OSU B919).',
    'range',
  ),
  'plan.canesPerVine': m('Fruit canes per vine without a bud target', 'canes', 1, 'From memory: two canes (double Guyot, bilateral cane).', 'integer'),
  'plan.maxCanesPerVine': m('Most fruit canes per vine', 'canes', 1, 'Four-cane Kniffin keeps four canes (UT PB1475; low authority).', 'integer'),
  'plan.renewalSpursPerCane': m('Renewal spurs per kept cane', 'spurs per cane', 0.5, NO_SOURCE),
  'plan.budsPerRenewalSpur': m(
    'Buds per renewal spur',
    'buds',
    1,
    'Midwest Grape Production Guide (OSU B919): "Renewal spur is 1 to 2 nodes long"; Yuma Sun 2022: "only two buds".',
    'integer',
  ),
  'plan.spursPerVine': m(
    'Spurs per vine without a bud target',
    'spurs',
    1,
    "Common practice, no source; 24 buds sits inside Ohio State's 20–50 buds per vine (2023 primer).",
    'integer',
  ),
  'plan.budsPerSpur': m('Buds per spur', 'buds', 1, 'Oxford Companion to Wine (2006), "spur pruning": spurs "retain only two buds".', 'integer'),
  'plan.maxBudsPerSpur': m('Most buds per fruiting spur', 'buds', 1, 'Common practice, no source; OSU B919 allows spurs of 2 to 6 nodes.', 'integer'),
  'plan.minSpurSpacingMm': m(
    'Least room along a cordon per spur',
    'mm',
    1,
    'A. Klodd, University of Minnesota Extension (Grapevine Magazine, Nov 2022): "one spur every 3-5 inches" (3 in).',
  ),
  'budLoad.minBudsPerFt': m(
    'Bud load, low end',
    'buds per ft of row',
    0.5,
    'Ohio State, "2023 Grape Pruning Primer" (M. Smith): "approximately 4-6 buds per foot of vine spacing".',
  ),
  'budLoad.maxBudsPerFt': m(
    'Bud load, high end',
    'buds per ft of row',
    0.5,
    'Ohio State, "2023 Grape Pruning Primer" (M. Smith): "approximately 4-6 buds per foot of vine spacing".',
  ),
  'pruning.formula': m(
    'Balanced-pruning formula',
    'buds + buds per further unit',
    1,
    'Ohio State, "2023 Grape Pruning Primer": "Vinifera 20 + 20" (per lb).',
    'formula',
  ),
  'budbreak.weakBelowPercent': m('Weak budbreak below', '%', 1, 'No published threshold exists. Common practice, no source.'),
  'budbreak.poorBelowPercent': m('Poor budbreak below', '%', 1, 'No published threshold exists. Common practice, no source.'),
  'budbreak.failedBelowPercent': m('Failed budbreak below', '%', 1, 'No published threshold exists. Common practice, no source.'),
  'budInjury.extraFromPercent': m(
    'Leave extra buds from primary bud kill',
    '%',
    1,
    'Cornell Northern New York Grape Update (28 Feb 2014): "if <20% of buds are injured, you don\'t need to leave extra buds".',
  ),
  'budInjury.minimalAbovePercent': m(
    'Prune minimally above primary bud kill',
    '%',
    1,
    'Purdue, Facts for Fancy Fruit, "Double pruning grapevines": ">50% bud damage- Minimally prune".',
  ),
  'ravaz.underBelow': m(
    'Ravaz index: under-cropped below',
    'kg/kg',
    0.5,
    'Wines & Vines, June 2017: "the optimum Ravaz Index ... can range from 5 to 10" (vinifera). Concord-type grapes read against their own range below.',
  ),
  'ravaz.overAbove': m(
    'Ravaz index: over-cropped above',
    'kg/kg',
    0.5,
    'Wines & Vines, June 2017: "the optimum Ravaz Index ... can range from 5 to 10" (vinifera). Concord-type grapes read against their own range below.',
  ),
  'ravazAmerican.underBelow': m(
    'Ravaz index, Concord-type grapes: under-cropped below',
    'kg/kg',
    0.5,
    'T. Bates, Cornell LERGP, "Vine Size: Magic Number 15": "< 10 ... undercropped" (Concord). Used for the Concord and American grape types.',
  ),
  'ravazAmerican.overAbove': m(
    'Ravaz index, Concord-type grapes: over-cropped above',
    'kg/kg',
    0.5,
    'T. Bates, Cornell LERGP, "Vine Size: Magic Number 15": "a Ravaz Index > 20 ... overcropped" (Concord). Used for the Concord and American grape types.',
  ),
  'trunkInjury.actAbovePercent': m('Trunk girdling: act above', '% of circumference', 1, NO_SOURCE),
  'trunkInjury.urgentAbovePercent': m(
    'Trunk girdling: urgent above',
    '% of circumference',
    1,
    'Common practice, no source: past half the circumference the trunk is usually renewed.',
  ),
  'caneInjury.urgentFromCanes': m(
    'Cane injury urgent from',
    'canes',
    1,
    'Common practice, no source: a two-cane vine with three badly hurt canes has no good spare.',
    'integer',
  ),
  'pruningRecord.fineWithinPercent': m('Pruning record fine within', '% of target', 1, NO_SOURCE),
  'pruningRecord.watchWithinPercent': m('Pruning record watch within', '% of target', 1, NO_SOURCE),
  'pruningRecord.actWithinPercent': m('Pruning record act within', '% of target', 1, NO_SOURCE),
  'crop.clustersPerShoot': m('Clusters per shoot', 'clusters', 0.1, 'From memory: fruitful vinifera shoots carry one to two clusters.'),
  'crop.clusterWeightG': m('Cluster weight at harvest', 'g', 1, "From memory: wine-grape clusters run from about 50 g to over 250 g; enter the block's own."),
  'crop.lagPhaseMultiplier': m(
    'Lag-phase cluster-weight multiplier',
    '×',
    0.1,
    'J. Fiola, University of Maryland Extension, "Crop Estimation": "cluster weights will double from lag phase to harvest".',
  ),
  'crop.yieldCvPercent': m(
    'Yield per vine: coefficient of variation',
    '%',
    1,
    'From memory (Wolpert & Vilas, AJEV 1992): vine yields commonly vary with a CV near 30%.',
  ),
  'crop.sampleMarginPercent': m(
    'Crop estimate margin',
    '% of the mean',
    1,
    'BC Wine Grape Council best-practice guide: "a good estimate will not vary by more than 10%".',
  ),
  'crop.bearingAfterSeasons': m(
    'A replant bears after',
    'seasons',
    1,
    'Common practice, no source: a replant carries its first real crop in its third leaf.',
    'integer',
  ),
  'labour.spurMinutesPerVine': m(
    'Spur pruning time',
    'min per vine',
    0.05,
    'Common practice, no source (Martinson & Vanden Heuvel, Cornell: each minute per vine is 13.5 h per acre at 807 vines/acre).',
  ),
  'labour.caneMinutesPerVine': m('Cane pruning time', 'min per vine', 0.05, 'From memory: cane pruning takes about 1.5 to 2 times the hours of spur pruning.'),
  'labour.hourlyCost': m('Cost of an hour of pruning', 'per hour', 0.5, "No source: a placeholder, since every crew's rate differs; set your own."),
});

export const SETTING_KEYS = Object.keys(SETTINGS_META) as SettingKey[];

export type SettingValue = number | BudRange | BalancedPruningFormula;

export function settingValue(settings: ViticultureSettings, key: SettingKey): SettingValue {
  const [group, name] = key.split('.') as [keyof ViticultureSettings, string];
  return (settings[group] as unknown as Record<string, SettingValue>)[name]!;
}

/** The keys an override sets (left-out and undefined keys set nothing). */
export function overriddenKeys(override: SettingsOverride | null | undefined): SettingKey[] {
  const keys: SettingKey[] = [];
  for (const [group, values] of Object.entries(override ?? {})) {
    for (const [key, value] of Object.entries((values ?? {}) as Record<string, unknown>)) {
      if (value !== undefined) keys.push(`${group}.${key}` as SettingKey);
    }
  }
  return keys;
}

/** Where an effective setting came from. */
export type SettingLevel = 'default' | 'organisation' | 'block';

export interface LayeredSettings {
  readonly settings: ViticultureSettings;
  /** For each setting, the level whose value is in `settings`. */
  readonly origin: Readonly<Record<SettingKey, SettingLevel>>;
  /**
   * Levels whose stored override no longer holds together with the levels under it (a later code
   * default or an organisation change broke an order), so they were left out rather than skewing
   * every judgement; a manager sees this on the settings screen.
   */
  readonly ignored: readonly { level: Exclude<SettingLevel, 'default'>; message: string }[];
}

/** `over`'s values laid on `under`'s, key by key; neither is changed. */
export function overlaySettings(under: SettingsOverride, over: SettingsOverride): SettingsOverride {
  const out: Record<string, Record<string, unknown>> = {};
  for (const layer of [under, over]) {
    for (const [group, values] of Object.entries(layer)) {
      for (const [key, value] of Object.entries((values ?? {}) as Record<string, unknown>)) {
        if (value !== undefined) (out[group] ??= {})[key] = value;
      }
    }
  }
  return out as SettingsOverride;
}

/**
 * The settings a block's judgements use: the defaults, then the organisation's override, then the
 * block's, each value saying which level it came from. An override that breaks the checks in
 * mergeSettings is left out with its message (see `ignored`), never thrown at a report.
 */
export function layerSettings(organisation?: SettingsOverride | null, block?: SettingsOverride | null): LayeredSettings {
  const ignored: { level: 'organisation' | 'block'; message: string }[] = [];
  let combined: SettingsOverride = {};
  let settings = DEFAULT_SETTINGS;
  const origin = Object.fromEntries(SETTING_KEYS.map((k) => [k, 'default'])) as Record<SettingKey, SettingLevel>;
  for (const [level, override] of [
    ['organisation', organisation],
    ['block', block],
  ] as const) {
    if (!override || overriddenKeys(override).length === 0) continue;
    const next = overlaySettings(combined, override);
    try {
      settings = mergeSettings(next);
    } catch (err) {
      if (!(err instanceof RangeError)) throw err;
      ignored.push({ level, message: err.message });
      continue;
    }
    combined = next;
    for (const key of overriddenKeys(override)) if (key in origin) origin[key] = level;
  }
  return { settings, origin, ignored };
}
