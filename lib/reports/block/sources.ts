/**
 * The published sources the report names beside its figures, in the words a reader can look up.
 * The same sources as lib/viticulture/README.md and the settings' comments; where a value has none,
 * the report says so ("common practice, no source", "from memory").
 */
export const SOURCES = {
  wilson:
    'E. B. Wilson (1927), "Probable inference, the law of succession, and statistical inference", Journal of the American Statistical Association 22:209 (the Wilson score interval)',
  budbreak: 'AWRI Technical Review 259 (R. Dixon, 2022): "% bud burst", shoots from the buds retained',
  weakBudbreak: 'the "weak" line is common practice, no source',
  canes: 'eXtension, "What are \'bull\' canes" (over ½ inch, long internodes); Westover, Wines & Vines, May 2016 (fruitful wood between 5/16 and ½ inch)',
  balancedPruning:
    'Ohio State University, "2023 Grape Pruning Primer", Table 1 (balanced-pruning formulas); West Virginia Department of Agriculture (3 lb of prunings gives 50 buds on 30 + 10)',
  budDensity: 'Ohio State University, "2023 Grape Pruning Primer": about 4–6 buds per foot of vine spacing',
  offTargetBands: 'the bands are common practice, no source',
  ravazVinifera: 'Wines & Vines, June 2017: a balanced Ravaz index "can range from 5 to 10"',
  ravazConcord: 'T. Bates, Cornell LERGP, "Vine Size: Magic Number 15": Concord balanced near 15, 10–20',
  ravazExample: 'AJEV, the Oakville trial table (9.8 kg of fruit on 1.30 kg of prunings: 7.5)',
  cropEstimate:
    'I. Dami, Ohio State University, "How to Estimate Grape Yields" (vines × clusters × cluster weight); AWRI Technical Review 259 (R. Dixon, 2022) for buds, budbreak and clusters per shoot',
  lagPhase: 'J. Fiola, University of Maryland Extension, "Crop Estimation": "cluster weights will double from lag phase to harvest"',
  sampleSize: 'Wolpert & Vilas, "Estimating vineyard yields: introduction to a simple, two-step method", AJEV Technical Brief (1992)',
  labour: 'Martinson & Vanden Heuvel, Cornell, "Training systems and Labor": each minute a vine is 13.5 hours an acre at 807 vines an acre',
  budKill: 'Cornell Northern New York Grape Update, 28 Feb 2014 (cut buds open and count the dead primaries)',
  budInjury:
    'Cornell Northern New York Grape Update, 28 Feb 2014 (35% dead: 40 buds become 54); Purdue, Facts for Fancy Fruit (over 50% damage, prune minimally); Michigan State table-grape guide (over 50%, delay pruning until after budbreak)',
  pruningCheck: "buds on the canes or spurs plus 2 a renewal spur: the crew check's own rule; bands common practice, no source",
  counting: 'plain counting and averages, no published source needed',
} as const;
