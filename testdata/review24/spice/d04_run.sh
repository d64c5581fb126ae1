#!/bin/sh
# closed loop, open loop, and return ratio variants of d04_ac.cir
cd "$(dirname "$0")"
sed -e 's/ KIN$/ 1/' -e 's/ KFB$/ 1/' -e 's/ KT$/ 0/' d04_ac.cir > /tmp/d04_closed.cir
sed -e 's/ KIN$/ 1/' -e 's/ KFB$/ 0/' -e 's/ KT$/ 0/' d04_ac.cir > /tmp/d04_open.cir
sed -e 's/ KIN$/ 0/' -e 's/ KFB$/ 0/' -e 's/ KT$/ 1/' -e '/^\.control/,/^\.endc/d' -e 's/^\.end$//' d04_ac.cir > /tmp/d04_loop.cir
cat >> /tmp/d04_loop.cir <<'EOT'
.control
ac dec 400 0.1 10meg
let T = -v(spk)/v(tst)
let Tdb = db(T)
let Tph = 180/pi*cph(T)
meas ac T1k find Tdb at=1k
meas ac Tph1k find Tph at=1k
meas ac fu_lo when Tdb=0 cross=1
meas ac fu_hi when Tdb=0 cross=last
meas ac ph_lo find Tph at=fu_lo
meas ac ph_hi find Tph at=fu_hi
meas ac Tmax max Tdb
.endc
.end
EOT
echo "== closed"; ngspice -b /tmp/d04_closed.cir 2>&1 | grep -E '^[a-z0-9_]+ += |rror'
echo "== open"; ngspice -b /tmp/d04_open.cir 2>&1 | grep -E '^[a-z0-9_]+ += |rror'
echo "== loop"; ngspice -b /tmp/d04_loop.cir 2>&1 | grep -E '^[a-z0-9_]+ += |rror'
