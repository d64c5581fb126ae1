#!/usr/bin/env python3
# usage: peak.py file.dat [col]  -> frequency of max |v| (columns: f re im per vector)
import sys
rows=[list(map(float,l.split())) for l in open(sys.argv[1]) if l.strip()]
nv=(len(rows[0]))//3
for k in range(nv):
    mags=[( (r[3*k+1]**2+r[3*k+2]**2)**0.5, r[3*k]) for r in rows]
    m,f=max(mags)
    # parabolic refine on log f
    i=[x[1] for x in mags].index(f)
    if 0<i<len(mags)-1:
        import math
        y0,y1,y2=[math.log(mags[j][0]) for j in (i-1,i,i+1)]
        x0,x1,x2=[math.log(mags[j][1]) for j in (i-1,i,i+1)]
        d=(y0-y2)/(2*(y0-2*y1+y2)) if (y0-2*y1+y2)!=0 else 0
        f=math.exp(x1+d*(x2-x1))
    print(f"vec{k}: peak {f/1e3:.2f} kHz |v|max {m:.4g}")
