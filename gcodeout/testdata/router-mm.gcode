(program: Golden test: square & circle [mm])
(machine: router, units: mm, coordinates to 3 decimals)
(shape: square 20 and circle 20 across, in test units)
(tool: 6 mm two-flute flat end mill)
(tolerance: 0.01 mm)
(Z0: top of the stock, cuts at negative Z)
(operation: square of four lines, circle of two arcs)
(operation: two dwells)
(CAUTION - before running it for real:)
(- dry-run it first: cut air with the tool raised clear of the stock)
(- check work zero X Y Z, the clamping and the tool and its holder)
(- keep the guards in place and wear eye and hearing protection)
(- follow the machine maker's instructions and local safety rules)
G21 G17 G90 G94
G0 Z5
M3 S18000
G4 P2
G0 X10 Y10
G1 Z-1.5 F300
G1 X30 Y10 F1200
G1 X30 Y30
G1 X10 Y30
G1 X10 Y10
G0 Z5
G0 X60 Y20
G1 Z-1.5 F300
G2 X40 Y20 I-10 J0 F1200
G2 X60 Y20 I10 J0
G4 P0.25
G0 Z5
G0 X45.123 Y7
G1 Z-1.5 F300
G4 P0.5
G0 Z5
G0 X0 Y0
M5
M2
