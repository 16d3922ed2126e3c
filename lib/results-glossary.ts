// One plain line for every technical figure the results page, the printed report and the
// exports show: the figure's name as a label and what it means for a pricing decision. Shown as
// a footnote or a title next to the number, so no figure appears bare. Our own words.

export type FigureId =
  | 'threshold' | 'interval' | 'slope' | 'lapse' | 'guess' | 'trials' | 'deviance' | 'devianceMc'
  | 'logLik' | 'parameters' | 'aic' | 'deltaAic' | 'chi2' | 'df' | 'p' | 'weberSlope' | 'weberFraction' | 'sigma' | 'respondentsKept';

export const FIGURES: Record<FigureId, { label: string; note: string }> = {
  threshold: { label: 'Notice threshold', note: 'The discount at which the fitted curve reaches the study’s target notice rate, as a share of the base price and in money.' },
  interval: { label: '95 % interval', note: 'The range the threshold lies in with 95 % confidence, from refitting resampled data; plan on its upper end to be safe.' },
  slope: { label: 'Slope', note: 'How sharply noticing rises around the threshold: a steeper curve means shoppers go from missing to noticing the saving over a narrower range of discounts.' },
  lapse: { label: 'Lapse rate', note: 'The share of trials missed even at a deep discount (a moment’s inattention); the fit keeps it between 0 and 6 %.' },
  guess: { label: 'Guess rate', note: 'How often a saving is reported when there is none (false alarms on catch trials; 50 % when picking one of two tags).' },
  trials: { label: 'Trials', note: 'Answered screens with a discount at this base price, after the exclusion rules.' },
  deviance: { label: 'Deviance', note: 'How far the observed notice rates sit from the curve; its p-value is small when they scatter more than chance allows.' },
  devianceMc: { label: 'Monte-Carlo p', note: 'The same check, calibrated by refitting resampled data instead of a χ² table; the poor-fit flag uses it.' },
  logLik: { label: 'Log-likelihood', note: 'How probable the answers are under the model; closer to 0 is better.' },
  parameters: { label: 'Parameters', note: 'How many numbers the model fits; more parameters always fit a little better, which AIC penalises.' },
  aic: { label: 'AIC', note: 'Misfit plus a penalty per parameter (Akaike’s information criterion); the lowest value is the preferred model.' },
  deltaAic: { label: 'Δ AIC', note: 'Distance from the best model’s AIC; under 2 is practically a tie.' },
  chi2: { label: 'χ²', note: 'Likelihood-ratio statistic: twice the log-likelihood the larger model gains over the simpler one.' },
  df: { label: 'df', note: 'Degrees of freedom: how many parameters the larger model adds.' },
  p: { label: 'p', note: 'How often chance alone would give a gain this large if the simpler model were true; under 0.05 means the simpler model misses something.' },
  weberSlope: { label: 'Weber slope', note: 'How the threshold in money grows with the base price on log scales: 1 = the same percentage at every price, 0 = the same amount.' },
  weberFraction: { label: 'Weber fraction', note: 'The one percentage of the base price that the Weber model fits for all prices.' },
  sigma: { label: 'Spread between shoppers (σ)', note: 'Standard deviation of shoppers’ own thresholds on the log-discount scale: 0 means every shopper notices the same discount.' },
  respondentsKept: { label: 'Respondents kept', note: 'Finished respondents left after the exclusion rules; each one is a sampled shopper.' },
};

export const figureLabel = (id: FigureId) => FIGURES[id].label;
export const figureNote = (id: FigureId) => FIGURES[id].note;
