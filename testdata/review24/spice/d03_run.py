# Drives d03_ac.cir's circuit across the gang and finds the aerial peak and the oscillator's 0-degree loop point.
import subprocess, math, os, re
base=open('d03_ac.cir').read()
a=base.index('.control'); b=base.index('.endc')
circ=base[:a]
IF=465e3
rows=[]
for cg in [15,25,35,50,75,100,150,200,250,300,350,400,450,490]:
    deck=circ.replace('.param pi=3.141592653589793 cg=15p','.param pi=3.141592653589793 cg=%gp'%cg)
    deck+=""".control
set wr_singlescale
ac lin 60001 300k 2.4meg
let ga = mag(v(sig_g)/v(aerial))
let L = v(osc_g)-v(k1)
wrdata /tmp/d03sw.dat ga real(L) imag(L)
.endc
.end
"""
    open('/tmp/d03sw.cir','w').write(deck)
    subprocess.run(['ngspice','-b','/tmp/d03sw.cir'],capture_output=True)
    d=[list(map(float,l.split())) for l in open('/tmp/d03sw.dat') if l.strip()]
    # columns: f ga f re f im (singlescale -> f ga re im)
    f=[r[0] for r in d]; ga=[r[1] for r in d]; re_=[r[2] for r in d]; im=[r[3] for r in d]
    i=max(range(len(ga)),key=lambda k:ga[k])
    # parabolic peak
    fa=f[i]
    # oscillator: imag sign change with real>0
    fo=None;Lm=None
    for k in range(len(f)-1):
        if im[k]*im[k+1]<0 and re_[k]>0:
            t=im[k]/(im[k]-im[k+1]); fo=f[k]+t*(f[k+1]-f[k]); rr=re_[k]+t*(re_[k+1]-re_[k]); Lm=20*math.log10(rr); break
    rows.append((cg,fa,fo,Lm))
    print("gang %4dp  aerial peak %8.2f kHz  osc(0deg) %8.2f kHz  loop %+6.2f dB  osc-IF %8.2f  track err %+7.2f kHz"%(cg,fa/1e3,fo/1e3,Lm,(fo-IF)/1e3,(fo-IF-fa)/1e3))
