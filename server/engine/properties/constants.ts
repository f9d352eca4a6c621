/**
 * Physical constants.
 */

/** Molar gas constant [J/(mol K)], exact (CODATA 2018; 2019 SI). Source: codata2018. */
export const R_GAS = 8.31446261815
/** Standard acceleration of gravity [m/s2], exact. */
export const G_ACC = 9.80665
/** Standard atmosphere [Pa], exact. */
export const P_ATM = 101325
/** 0 degC [K]. */
export const T_ZERO_C = 273.15
/** Reference temperature of Henry constants [K]. */
export const T_REF_HENRY = 298.15
/** 1 mmHg [Pa] (= 101325/760). */
export const MMHG = 101325 / 760
