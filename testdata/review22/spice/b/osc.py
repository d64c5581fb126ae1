#!/usr/bin/env python3
# usage: osc.py file.dat [t_from]  -> oscillation frequency from mean crossings after t_from
import sys,bisect
rows=[list(map(float,l.split())) for l in open(sys.argv[1]) if l.strip()]
t0=float(sys.argv[2]) if len(sys.argv)>2 else 200e-6
t=[r[0] for r in rows]; v=[r[1] for r in rows]
i0=bisect.bisect_left(t,t0); x=v[i0:]; tt=t[i0:]; m=sum(x)/len(x)
zc=[tt[i]+(m-x[i])/(x[i+1]-x[i])*(tt[i+1]-tt[i]) for i in range(len(x)-1) if x[i]<m<=x[i+1]]
print(f"{sys.argv[1]}: f={(len(zc)-1)/(zc[-1]-zc[0])/1e6:.5f} MHz  pp={max(x)-min(x):.3f}")
