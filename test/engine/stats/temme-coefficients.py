# Power-series coefficients of Temme's c_k(eta) (Temme 1979; DLMF 8.12.9-8.12.11), derived with sympy.
import sympy as sp
e = sp.symbols('e')
N = 26
# invert eta^2/2 = mu - log(1+mu), mu = lambda - 1, mu ~ eta + ...
mu = e
for it in range(N+2):
    f = sp.series(mu - sp.log(1+mu) - e**2/2, e, 0, N+3).removeO()
    fp = sp.series(1 - 1/(1+mu), e, 0, N+3).removeO()
    # Newton in series: mu <- mu - f/fp ; fp ~ e
    corr = sp.series(f/fp, e, 0, N+2).removeO()
    new = sp.expand(mu - corr)
    new = sum(new.coeff(e, k)*e**k for k in range(0, N+2))
    if sp.simplify(new - mu) == 0: break
    mu = new
print('mu', [mu.coeff(e,k) for k in range(6)])
# gamma_k: Gamma*(a) ~ sum gamma_k a^-k
g = [sp.Rational(1), sp.Rational(1,12), sp.Rational(1,288), sp.Rational(-139,51840), sp.Rational(-571,2488320),
     sp.Rational(163879,209018880), sp.Rational(5246819,75246796800), sp.Rational(-534703531,902961561600),
     sp.Rational(-4483131259,86684309913600), sp.Rational(432261921612371,514904800886784000)]
inv_mu = sp.series(1/mu, e, 0, N).removeO()
c = [sp.expand(sp.series(1/mu - 1/e, e, 0, N).removeO())]
K = 10
for k in range(1, K):
    prev = c[-1]
    d = sp.expand(sp.diff(prev, e)/e)
    ck = sp.expand(d + (-1)**k * g[k] * inv_mu)
    deg = N - 2*k
    ck = sum(ck.coeff(e, j)*e**j for j in range(0, max(deg, 2)))
    c.append(sp.expand(ck))
import json
out = [[float(ck.coeff(e, j)) for j in range(0, N - 2*k if N-2*k>2 else 2)] for k, ck in enumerate(c)]
print(json.dumps(out))
for k in range(4): print(k, [ck for ck in [c[k].coeff(e,j) for j in range(4)]])
