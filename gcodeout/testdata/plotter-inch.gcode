(program: Golden test: square & circle [inch])
(machine: plotter, units: inch, coordinates to 5 decimals)
(shape: square 20 and circle 20 across, in test units)
(pen: 0.5 mm fibre tip)
(tolerance: 0.0005 inch)
(Z0: the paper surface)
(operation: square of four lines, circle of two arcs)
(operation: two dwells)
(CAUTION - before running it for real:)
(- dry-run it with the pen lifted clear of the paper)
(- check work zero, that the paper is held flat and the pen)
(- keep the guards in place, hands clear, and wear eye protection)
(- follow the machine maker's instructions and local safety rules)
G20 G17 G90 G94
G0 Z0.15
G0 X0.5 Y0.5
G1 Z0 F45
G1 X1.5 Y0.5 F150
G1 X1.5 Y1.5
G1 X0.5 Y1.5
G1 X0.5 Y0.5
G0 Z0.15
G0 X3 Y1
G1 Z0 F45
G2 X2 Y1 I-0.5 J0 F150
G2 X3 Y1 I0.5 J0
G4 P0.25
G0 Z0.15
G0 X2.25617 Y0.35002
G1 Z0 F45
G4 P0.5
G0 Z0.15
G0 X0 Y0
M2
