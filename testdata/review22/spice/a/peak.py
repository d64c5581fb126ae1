import sys,math
for fn in sys.argv[1:]:
    rows=[list(map(float,l.split())) for l in open(fn) if l.strip()]
    best=max(rows,key=lambda r:r[1]**2+r[2]**2)
    # local maxima
    mags=[math.hypot(r[1],r[2]) for r in rows]
    pk=[(rows[i][0],mags[i]) for i in range(1,len(rows)-1) if mags[i]>mags[i-1] and mags[i]>=mags[i+1]]
    print(fn, ["%.4f kHz |%.4g|"%(f/1e3,m) for f,m in pk])
