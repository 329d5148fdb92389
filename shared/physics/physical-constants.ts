// CODATA 2018 exact values (SI redefinition of 2019): c, h, k_B are defined constants.
export const SPEED_OF_LIGHT_M_PER_S = 299_792_458
export const PLANCK_J_S = 6.626_070_15e-34
export const REDUCED_PLANCK_J_S = PLANCK_J_S / (2 * Math.PI)
export const BOLTZMANN_J_PER_K = 1.380_649e-23
