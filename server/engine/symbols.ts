/**
 * Symbols used as argument names across the engine (listed once, house style).
 * All SI unless stated.
 *
 * | symbol | meaning | unit |
 * |---|---|---|
 * | V, V1, Vp | gas flow in (bottom), out (top), solute-free (V') | mol/s |
 * | L0, LN, Lp | solvent in (top), out (bottom), solute-free (L') | mol/s |
 * | y, yIn, y1 | gas solute mole fraction; inlet y_{N+1}; outlet y_1 | - |
 * | x, x0, xN | liquid solute mole fraction; lean solvent; rich solvent | - |
 * | Y, X | solute-free mole ratios Y = y/(1-y), X = x/(1-x) | - |
 * | K, K0 | equilibrium ratio y/x; its value at x -> 0 | - |
 * | A | absorption factor L/(K V) | - |
 * | N | ideal stages (fractional) | - |
 * | Eo | overall tray efficiency | - |
 * | T, P | temperature; absolute pressure | K; Pa |
 * | M, ML, Ms, Mc | molar mass (liquid, solute, carrier) | kg/mol |
 * | rhoL, rhoV | liquid, gas density | kg/m3 |
 * | muL, muV | liquid, gas viscosity | Pa s |
 * | sigma | surface tension | N/m |
 * | FLV | flow parameter (L/G)(rhoV/rhoL)^0.5, mass flows | - |
 * | CF, C | Fair capacity parameter, corrected capacity | m/s |
 * | vF | flooding velocity on the net area | m/s |
 * | t | tray spacing | m |
 * | f | fraction of flood | - |
 * | D | tower diameter | m |
 * | At, Ad, An, Aa, Ah | tower, downcomer, net, active, hole areas | m2 |
 * | AhAa, AdAt | hole/active, downcomer/tower area ratios | - |
 * | dO, p, l | hole diameter, hole pitch, plate thickness | m |
 * | hw, how, hL, hd, ht | weir height, crest over weir, clear liquid, dry-tray head, total head | m of liquid |
 * | vo, va | hole velocity, active-area velocity | m/s |
 * | Ks | capacity parameter on the active area va (rhoV/(rhoL-rhoV))^0.5 | m/s |
 * | phiE | relative froth density | - |
 * | Fr | hole Froude number | - |
 * | qL | liquid volumetric flow | m3/s |
 * | Lw | weir length | m |
 * | S, E, CA | allowable stress, joint efficiency, corrosion allowance | Pa, -, m |
 */
export const SYMBOLS_DOC = 'see the comment of server/engine/symbols.ts'
