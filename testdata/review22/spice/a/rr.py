import sys,math,cmath
# find frequencies where phase of return ratio crosses 0 (imag changes sign with real>0)
for fn in sys.argv[1:]:
    rows=[list(map(float,l.split())) for l in open(fn) if l.strip() and not l.startswith('#')]
    out=[]
    for a,b in zip(rows,rows[1:]):
        if a[2]*b[2]<=0 and a[1]>0:
            t=a[2]/(a[2]-b[2]); f=a[0]+t*(b[0]-a[0]); re_=a[1]+t*(b[1]-a[1])
            out.append((f,20*math.log10(abs(re_))))
    print(fn, ["%.4f MHz %.2f dB"%(f/1e6,g) for f,g in out])
