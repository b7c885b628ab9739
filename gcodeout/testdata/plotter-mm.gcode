(program: Golden test: square & circle [mm])
(machine: plotter, units: mm, coordinates to 3 decimals)
(shape: square 20 and circle 20 across, in test units)
(pen: 0.5 mm fibre tip)
(tolerance: 0.01 mm)
(Z0: the paper surface)
(operation: square of four lines, circle of two arcs)
(operation: two dwells)
(CAUTION - before running it for real:)
(- dry-run it with the pen lifted clear of the paper)
(- check work zero, that the paper is held flat and the pen)
(- keep the guards in place, hands clear, and wear eye protection)
(- follow the machine maker's instructions and local safety rules)
G21 G17 G90 G94
G0 Z3
G0 X10 Y10
G1 Z0 F900
G1 X30 Y10 F3000
G1 X30 Y30
G1 X10 Y30
G1 X10 Y10
G0 Z3
G0 X60 Y20
G1 Z0 F900
G2 X40 Y20 I-10 J0 F3000
G2 X60 Y20 I10 J0
G4 P0.25
G0 Z3
G0 X45.123 Y7
G1 Z0 F900
G4 P0.5
G0 Z3
G0 X0 Y0
M2
