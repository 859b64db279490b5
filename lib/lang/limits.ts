import { MAX_INPUTS } from "../logic/index";

/** Size limits of one source; every one is named in the diagnostic that reports it. */
export interface LanguageLimits {
  /** Longest accepted source, in characters. Default 200000. */
  maxSourceLength?: number;
  /** Most statements (logical lines, block lines included). Default 2000. */
  maxStatements?: number;
  /** Most inputs one output may depend on. Default 30 (MAX_INPUTS). */
  maxInputsPerOutput?: number;
  /** Deepest nesting of parentheses (block calls included), and longest run of NOT signs, on one statement. Default 64. */
  maxNesting?: number;
  /** Most product terms an intermediate result may hold while elaborating beyond truth-table size. Default 20000. */
  maxCubes?: number;
}

export const DEFAULT_LIMITS: Required<LanguageLimits> = {
  maxSourceLength: 200_000,
  maxStatements: 2000,
  maxInputsPerOutput: MAX_INPUTS,
  maxNesting: 64,
  maxCubes: 20_000,
};

export function withDefaults(l: LanguageLimits | undefined): Required<LanguageLimits> {
  return { ...DEFAULT_LIMITS, ...(l ?? {}) };
}
