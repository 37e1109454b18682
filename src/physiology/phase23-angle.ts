const DEG_PER_RAD = 180 / Math.PI;

/**
 * Angle between the phase II and phase III lines of the volumetric capnogram (II/III angle), degrees: the angle at
 * their meeting point, open toward the upper left, between the rising phase II line and the phase III line. 180°
 * would be one straight line; the steeper phase III (or the flatter phase II), the wider the angle.
 *
 * The angle depends on the axis units, so both axes are fixed here: volume in litres and PCO2 as a fraction of
 * PĀECO2, i.e. the slopes enter normalised by PĀECO2 (1/L, normalisedSlope). Then
 *
 *   angle [°] = 180 - atan(SnII) + atan(SnIII)   (atan in degrees; SnII, SnIII in 1/L).
 *
 * Source: the angle between the phase II and phase III slopes ("alpha angle") as a shape index of the capnogram:
 * Bhavani-Shankar K et al. 1995, "Terminology and the current limitations of time capnography: a brief review", J Clin
 * Monit 11:175-182 (time capnogram); with an ultrasonic spirometer recording volume and CO2 together, in degrees: Jalušić Glunčić T, Basara L,
 * Konecki L, Tomić S, Samaržija M, Jakopović M 2015, "Capnographic measurement as a screening method for respiratory
 * obstructive diseases", Eur Respir J 46 suppl 59:PA1039 (abstract). The axis convention (litres, PCO2 / PĀECO2) and
 * the formula are derived here: the published texts read here do not state the axes.
 *
 * NaN propagates. A vertical phase II (SnII = +Infinity) gives 90° + atan(SnIII).
 *
 * @example phase23AngleDeg(1, 0) // 135; phase23AngleDeg(Math.sqrt(3), 1 / Math.sqrt(3)) // 150
 */
export function phase23AngleDeg(phase2SlopeNormPerL: number, phase3SlopeNormPerL: number): number {
  return 180 - Math.atan(phase2SlopeNormPerL) * DEG_PER_RAD + Math.atan(phase3SlopeNormPerL) * DEG_PER_RAD;
}
