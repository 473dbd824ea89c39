%
O1001 (BRACKET POCKET FLOOR - FINISHING PASS)
(Invented demo part: 30 x 20 mm pocket, 8 mm corner radii, floor at Z0,)
(pocket from X5 Y5 to X35 Y25. Tool T2: 6 mm bull-nose, 1 mm corner radius.)
(Helical entry at the pocket centre, a centre pass, then three rings inside out,)
(2.5 mm apart, counter-clockwise: climb milling with the spindle on M3.)
(Hand-written for cuspmap's examples; not proven on a machine. Rotating tools,)
(workholding and fine metal dust are hazards: follow the machine maker's)
(instructions and local rules before running any program.)
N10 G17 G21 G90 G94 G40 G49 G80
N20 T2 M6
N30 G54
N40 M3 S9000
N50 G0 X22 Y15 Z5
N60 G0 Z2
N70 G1 Z0.5 F300
N80 G3 X22 Y15 Z0 I-2 J0 F600 (helix: one turn down to the floor)
N90 G1 X27
N100 X13 (centre pass along Y15)
N110 Y13
(ring 2: 14 x 4 mm, sharp corners, 8 mm in from the walls)
N120 X27
N130 Y17
N140 X13
N150 Y13
(ring 1: 5.5 mm in from the walls, 2.5 mm corner arcs, centre and radius forms)
N160 Y10.5
N170 X27
N180 G3 X29.5 Y13 I0 J2.5
N190 G1 Y17
N200 G3 X27 Y19.5 R2.5
N210 G1 X13
N220 G3 X10.5 Y17 I0 J-2.5
N230 G1 Y13
N240 G3 X13 Y10.5 R2.5
(ring 0: 3 mm in from the walls, the tool's edge on the wall, 5 mm corner arcs)
N250 G1 Y8
N260 X27
N270 G3 X32 Y13 I0 J5
N280 G1 Y17
N290 G3 X27 Y22 I-5 J0
N300 G1 X13
N310 G3 X8 Y17 I0 J-5
N320 G1 Y13
N330 G3 X13 Y8 I5 J0
N340 G0 Z5
N350 M5
N360 G0 Z25
N370 M30
%
