(program: Golden test: square & circle [inch])
(machine: laser, units: inch, coordinates to 5 decimals)
(shape: square 20 and circle 20 across, in test units)
(kerf: 0.15 mm)
(tolerance: 0.0005 inch)
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
G20 G17 G90 G94
M5
G0 X0.5 Y0.5
M3 S750
G4 P0.1
G1 X1.5 Y0.5 F30
G1 X1.5 Y1.5
G1 X0.5 Y1.5
G1 X0.5 Y0.5
M5
G0 X3 Y1
M3 S750
G4 P0.1
G2 X2 Y1 I-0.5 J0
G2 X3 Y1 I0.5 J0
G4 P0.25
M5
G0 X2.25617 Y0.35002
M3 S750
G4 P0.1
G4 P0.5
M5
G0 X0 Y0
M5
M2
