(program: Golden test: square & circle [inch])
(machine: router, units: inch, coordinates to 5 decimals)
(shape: square 20 and circle 20 across, in test units)
(tool: 6 mm two-flute flat end mill)
(tolerance: 0.0005 inch)
(Z0: top of the stock, cuts at negative Z)
(operation: square of four lines, circle of two arcs)
(operation: two dwells)
(CAUTION - before running it for real:)
(- dry-run it first: cut air with the tool raised clear of the stock)
(- check work zero X Y Z, the clamping and the tool and its holder)
(- keep the guards in place and wear eye and hearing protection)
(- follow the machine maker's instructions and local safety rules)
G20 G17 G90 G94
G0 Z0.25
M3 S18000
G4 P2
G0 X0.5 Y0.5
G1 Z-0.075 F15
G1 X1.5 Y0.5 F60
G1 X1.5 Y1.5
G1 X0.5 Y1.5
G1 X0.5 Y0.5
G0 Z0.25
G0 X3 Y1
G1 Z-0.075 F15
G2 X2 Y1 I-0.5 J0 F60
G2 X3 Y1 I0.5 J0
G4 P0.25
G0 Z0.25
G0 X2.25617 Y0.35002
G1 Z-0.075 F15
G4 P0.5
G0 Z0.25
G0 X0 Y0
M5
M2
