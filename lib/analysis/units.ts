// Unit constants for the hold-down model. Source: NIST SP 811 (2008), Appendix B.
export const MM_PER_IN = 25.4;
export const PA_PER_INHG = 3386.389;
export const PA_PER_PSI = 6894.757;
export const N_PER_LBF = 4.448222;
export const MM2_PER_M2 = 1e6;
