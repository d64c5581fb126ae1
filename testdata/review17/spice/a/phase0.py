import math,sys
# usage: phase0.py file.dat  (wrdata of mag(x) ph(x): columns f mag f ph)
for fn in sys.argv[1:]:
    rows=[list(map(float,l.split())) for l in open(fn).readlines()[1:]]
    prev=None
    for r in rows:
        f,m,ph=r[0],r[1],r[-1]
        if prev and (prev[2]>0)!=(ph>0) and abs(ph)<1.5:
            f0=prev[0]+(f-prev[0])*(0-prev[2])/(ph-prev[2])
            print(fn,'phase zero at %.1f Hz'%f0,'loop %.2f dB'%(20*math.log10(m)))
        prev=(f,m,ph)
