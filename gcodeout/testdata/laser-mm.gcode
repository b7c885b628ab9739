(program: Golden test: square & circle [mm])
(machine: laser, units: mm, coordinates to 3 decimals)
(shape: square 20 and circle 20 across, in test units)
(kerf: 0.15 mm)
(tolerance: 0.01 mm)
(Z0: not used, the program moves no Z)
(operation: square of four lines, circle of two arcs)
(operation: two dwells)
(CAUTION - before running it for real:)
(- dry-run it with the beam off or at zero power, above the work)
(- check work zero, how the work is held down and the focus)
(- keep the enclosure closed and wear eyewear rated for this laser)
(- never leave the laser running unattended)
(- run the fume extraction for the whole job)
(- follow the machine maker's instructions and local safety rules)
G21 G17 G90 G94
M5
G0 X10 Y10
M3 S750
G4 P0.1
G1 X30 Y10 F600
G1 X30 Y30
G1 X10 Y30
G1 X10 Y10
M5
G0 X60 Y20
M3 S750
G4 P0.1
G2 X40 Y20 I-10 J0
G2 X60 Y20 I10 J0
G4 P0.25
M5
G0 X45.123 Y7
M3 S750
G4 P0.1
G4 P0.5
M5
G0 X0 Y0
M5
M2
