/* dop853.c: Dormand & Prince's explicit Runge-Kutta pair of order 8 with error estimators of orders 5
 * and 3 and a continuous extension of order 7, for the state of one flight.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Source: Hairer, E., Norsett, S. P. & Wanner, G. (1993), Solving Ordinary Differential Equations I:
 * Nonstiff Problems, 2nd ed., Springer, section II.10 (the 8(5,3) pair of Dormand & Prince, its dense
 * output, and the code DOP853 printed with the book). The coefficients below are that method's,
 * transcribed to 30 digits; tests/unit/test_dop853.c checks the order conditions they must satisfy.
 *
 * One step from (t, y) with step h and stages k_1 = f(t, y), k_i = f(t + c_i h, y + h sum_j a_ij k_j):
 *   y_new = y + h sum_i b_i k_i                      (order 8; b_i = a_13,i)
 *   err5  = h sum_i e5_i k_i,   err3 = h sum_i (b_i - bhat_i) k_i
 *   err   = |err5|^2 / sqrt(n (|err5|^2 + 0.01 |err3|^2))   with each component divided by
 *           sk_i = atol + rtol max(|y_i|, |y_new_i|)  (Hairer et al. eq. II.10.17 and DOP853's ERR)
 * accepted when err <= 1; the next step is h / clamp(err^(1/8) / 0.9, 1/6, 3) (DOP853's defaults:
 * SAFE = 0.9, FAC1 = 0.333, FAC2 = 6, BETA = 0), and never grows right after a rejection.
 * The continuous extension at theta = (t* - t) / h uses three more stages and
 *   y(theta) = y + theta (F0 + (1-theta) (F1 + theta (F2 + (1-theta) (F3 + theta (F4 + (1-theta) (F5 + theta F6))))))
 * with F0 = dy, F1 = h f_0 - dy, F2 = 2 dy - h (f_0 + f_1), F3..F6 = h sum_j d_rj k_j.
 *
 * Written here rather than taken from GSL because GSL's odeiv2 steppers offer no continuous extension
 * (events would need a re-integration per trial time) and its driver works on run-time dimensions.
 */
#include <float.h>
#include <math.h>
#include <string.h>

#include "numerics/dop853.h"

#define N DOP853_N

static const double C[16] = {0.0, 0.526001519587677318785587544488e-01, 0.789002279381515978178381316732e-01, 0.118350341907227396726757197510, 0.281649658092772603273242802490, 0.333333333333333333333333333333, 0.25, 0.307692307692307692307692307692, 0.651282051282051282051282051282, 0.6, 0.857142857142857142857142857142, 1.0, 1.0, 0.1, 0.2, 0.777777777777777777777777777778};
typedef struct stage_row {
    int n;           /* non-zero entries */
    int j[9];        /* their columns */
    double a[9];     /* their values */
} stage_row;

/* Row i of the Butcher matrix as its non-zero entries a_ij, j < i (rows 13 to 15: the continuous extension's
 * extra stages; row 12: the weights b_j of the eighth-order solution). */
static const stage_row A[16] = {
    {0, {0}, {0.0}},
    {1, {0},
     {5.26001519587677318785587544488e-2}},
    {2, {0, 1},
     {1.97250569845378994544595329183e-2, 5.91751709536136983633785987549e-2}},
    {2, {0, 2},
     {2.95875854768068491816892993775e-2, 8.87627564304205475450678981324e-2}},
    {3, {0, 2, 3},
     {2.41365134159266685502369798665e-1, -8.84549479328286085344864962717e-1, 9.24834003261792003115737966543e-1}},
    {3, {0, 3, 4},
     {3.7037037037037037037037037037e-2, 1.70828608729473871279604482173e-1, 1.25467687566822425016691814123e-1}},
    {4, {0, 3, 4, 5},
     {3.7109375e-2, 1.70252211019544039314978060272e-1, 6.02165389804559606850219397283e-2, -1.7578125e-2}},
    {5, {0, 3, 4, 5, 6},
     {3.70920001185047927108779319836e-2, 1.70383925712239993810214054705e-1, 1.07262030446373284651809199168e-1, -1.53194377486244017527936158236e-2, 8.27378916381402288758473766002e-3}},
    {6, {0, 3, 4, 5, 6, 7},
     {6.24110958716075717114429577812e-1, -3.36089262944694129406857109825, -8.68219346841726006818189891453e-1, 2.75920996994467083049415600797e1, 2.01540675504778934086186788979e1, -4.34898841810699588477366255144e1}},
    {7, {0, 3, 4, 5, 6, 7, 8},
     {4.77662536438264365890433908527e-1, -2.48811461997166764192642586468, -5.90290826836842996371446475743e-1, 2.12300514481811942347288949897e1, 1.52792336328824235832596922938e1, -3.32882109689848629194453265587e1, -2.03312017085086261358222928593e-2}},
    {8, {0, 3, 4, 5, 6, 7, 8, 9},
     {-9.3714243008598732571704021658e-1, 5.18637242884406370830023853209, 1.09143734899672957818500254654, -8.14978701074692612513997267357, -1.85200656599969598641566180701e1, 2.27394870993505042818970056734e1, 2.49360555267965238987089396762, -3.0467644718982195003823669022}},
    {9, {0, 3, 4, 5, 6, 7, 8, 9, 10},
     {2.27331014751653820792359768449, -1.05344954667372501984066689879e1, -2.00087205822486249909675718444, -1.79589318631187989172765950534e1, 2.79488845294199600508499808837e1, -2.85899827713502369474065508674, -8.87285693353062954433549289258, 1.23605671757943030647266201528e1, 6.43392746015763530355970484046e-1}},
    {8, {0, 5, 6, 7, 8, 9, 10, 11},
     {5.42937341165687622380535766363e-2, 4.45031289275240888144113950566, 1.89151789931450038304281599044, -5.8012039600105847814672114227, 3.1116436695781989440891606237e-1, -1.52160949662516078556178806805e-1, 2.01365400804030348374776537501e-1, 4.47106157277725905176885569043e-2}},
    {8, {0, 6, 7, 8, 9, 10, 11, 12},
     {5.61675022830479523392909219681e-2, 2.53500210216624811088794765333e-1, -2.46239037470802489917441475441e-1, -1.24191423263816360469010140626e-1, 1.5329179827876569731206322685e-1, 8.20105229563468988491666602057e-3, 7.56789766054569976138603589584e-3, -8.298e-3}},
    {8, {0, 5, 6, 7, 10, 11, 12, 13},
     {3.18346481635021405060768473261e-2, 2.83009096723667755288322961402e-2, 5.35419883074385676223797384372e-2, -5.49237485713909884646569340306e-2, -1.08347328697249322858509316994e-4, 3.82571090835658412954920192323e-4, -3.40465008687404560802977114492e-4, 1.41312443674632500278074618366e-1}},
    {8, {0, 5, 6, 7, 8, 12, 13, 14},
     {-4.28896301583791923408573538692e-1, -4.69762141536116384314449447206, 7.68342119606259904184240953878, 4.06898981839711007970213554331, 3.56727187455281109270669543021e-1, -1.39902416515901462129418009734e-3, 2.9475147891527723389556272149, -9.15095847217987001081870187138}},
};
static const double E5[12] = {0.1312004499419488073250102996e-1, 0.0, 0.0, 0.0, 0.0, -0.1225156446376204440720569753e+1, -0.4957589496572501915214079952, 0.1664377182454986536961530415e+1, -0.3503288487499736816886487290, 0.3341791187130174790297318841, 0.8192320648511571246570742613e-1, -0.2235530786388629525884427845e-1};
static const double DC[4][16] = {
    {-0.84289382761090128651353491142e+1, 0.0, 0.0, 0.0, 0.0, 0.56671495351937776962531783590, -0.30689499459498916912797304727e+1, 0.23846676565120698287728149680e+1, 0.21170345824450282767155149946e+1, -0.87139158377797299206789907490, 0.22404374302607882758541771650e+1, 0.63157877876946881815570249290, -0.88990336451333310820698117400e-1, 0.18148505520854727256656404962e+2, -0.91946323924783554000451984436e+1, -0.44360363875948939664310572000e+1},
    {0.10427508642579134603413151009e+2, 0.0, 0.0, 0.0, 0.0, 0.24228349177525818288430175319e+3, 0.16520045171727028198505394887e+3, -0.37454675472269020279518312152e+3, -0.22113666853125306036270938578e+2, 0.77334326684722638389603898808e+1, -0.30674084731089398182061213626e+2, -0.93321305264302278729567221706e+1, 0.15697238121770843886131091075e+2, -0.31139403219565177677282850411e+2, -0.93529243588444783865713862664e+1, 0.35816841486394083752465898540e+2},
    {0.19985053242002433820987653617e+2, 0.0, 0.0, 0.0, 0.0, -0.38703730874935176555105901742e+3, -0.18917813819516756882830838328e+3, 0.52780815920542364900561016686e+3, -0.11573902539959630126141871134e+2, 0.68812326946963000169666922661e+1, -0.10006050966910838403183860980e+1, 0.77771377980534432092869265740, -0.27782057523535084065932004339e+1, -0.60196695231264120758267380846e+2, 0.84320405506677161018159903784e+2, 0.11992291136182789328035130030e+2},
    {-0.25693933462703749003312586129e+2, 0.0, 0.0, 0.0, 0.0, -0.15418974869023643374053993627e+3, -0.23152937917604549567536039109e+3, 0.35763911791061412378285349910e+3, 0.93405324183624310003907691704e+2, -0.37458323136451633156875139351e+2, 0.10409964950896230045147246184e+3, 0.29840293426660503123344363579e+2, -0.43533456590011143754432175058e+2, 0.96324553959188282948394950600e+2, -0.39177261675615439165231486172e+2, -0.14972683625798562581422125276e+3},
};
/* b_i - bhat_i of the third-order estimator: the weights b_i less these three. */
static const double BHH1 = 0.244094488188976377952755905512, BHH9 = 0.733846688281611857341361741547,
                    BHH12 = 0.220588235294117647058823529412e-1;

#define SAFE 0.9
#define FAC_MIN (1.0 / 6.0) /* 1 / FAC2: the step grows at most sixfold */
#define FAC_MAX 3.0         /* 1 / FAC1: and shrinks at most threefold per attempt */

/* y0 + h sum_j a_ij k_j over the row's non-zero entries, for the first n components (6 or 8; unrolled: the
 * accumulators stay in registers). */
static inline void stage_state(const double y0[N], double (*k)[N], int i, double h, double out[N], int n)
{
    const stage_row *r = &A[i];
    double a0 = 0.0, a1 = 0.0, a2 = 0.0, a3 = 0.0, a4 = 0.0, a5 = 0.0, a6 = 0.0, a7 = 0.0;
    if (n <= 6) {
        for (int m = 0; m < r->n; m++) {
            const double c = r->a[m], *kj = k[r->j[m]];
            a0 += c * kj[0], a1 += c * kj[1], a2 += c * kj[2];
            a3 += c * kj[3], a4 += c * kj[4], a5 += c * kj[5];
        }
    } else {
        for (int m = 0; m < r->n; m++) {
            const double c = r->a[m], *kj = k[r->j[m]];
            a0 += c * kj[0], a1 += c * kj[1], a2 += c * kj[2], a3 += c * kj[3];
            a4 += c * kj[4], a5 += c * kj[5], a6 += c * kj[6], a7 += c * kj[7];
        }
    }
    out[0] = y0[0] + h * a0, out[1] = y0[1] + h * a1, out[2] = y0[2] + h * a2, out[3] = y0[3] + h * a3;
    out[4] = y0[4] + h * a4, out[5] = y0[5] + h * a5, out[6] = y0[6] + h * a6, out[7] = y0[7] + h * a7;
}

static double weight(const dop853 *s, double a, double b) { return s->atol + s->rtol * fmax(fabs(a), fabs(b)); }

int dop853_init(dop853 *s, dop853_rhs f, void *user, double rtol, double atol, double t0, const double y0[N],
                double t_end)
{
    memset(s, 0, sizeof *s);
    s->f = f;
    s->user = user;
    s->rtol = rtol;
    s->atol = atol;
    s->n_err = N;
    s->n = N;
    s->t = s->t_old = t0;
    memcpy(s->y, y0, sizeof s->y);
    memcpy(s->y_old, y0, sizeof s->y);
    s->facold = 1e-4;
    if (f(t0, y0, s->fy, user) != 0)
        return DOP853_ERHS;
    s->nfev = 1;
    memcpy(s->f_old, s->fy, sizeof s->fy);
    /* Starting step (Hairer et al. 1993, section II.4, "automatic step size selection", as in DOP853's
     * HINIT): a first guess from |y| / |f|, one explicit Euler step to estimate the second derivative,
     * then h with h^8 max(|f'|, |f|) = 0.01. */
    double hmax = fabs(t_end - t0);
    double dnf = 0.0, dny = 0.0;
    for (int n = 0; n < N; n++) {
        double sk = s->atol + s->rtol * fabs(y0[n]);
        dnf += (s->fy[n] / sk) * (s->fy[n] / sk);
        dny += (y0[n] / sk) * (y0[n] / sk);
    }
    double h = (dnf <= 1e-10 || dny <= 1e-10) ? 1e-6 : 0.01 * sqrt(dny / dnf);
    h = fmin(h, hmax);
    double y1[N], f1[N];
    for (int n = 0; n < N; n++)
        y1[n] = y0[n] + h * s->fy[n];
    if (f(t0 + h, y1, f1, user) != 0) {
        s->h = 1e-3 * h; /* a first step that cannot be evaluated: start far shorter */
        return DOP853_OK;
    }
    s->nfev++;
    double der2 = 0.0;
    for (int n = 0; n < N; n++) {
        double sk = s->atol + s->rtol * fabs(y0[n]);
        der2 += ((f1[n] - s->fy[n]) / sk) * ((f1[n] - s->fy[n]) / sk);
    }
    der2 = sqrt(der2) / h;
    double der12 = fmax(fabs(der2), sqrt(dnf));
    double h1 = der12 <= 1e-15 ? fmax(1e-6, h * 1e-3) : pow(0.01 / der12, 1.0 / 8.0);
    s->h = fmin(fmin(100.0 * h, h1), hmax);
    return DOP853_OK;
}

int dop853_step(dop853 *s, double t_end)
{
    int failures = 0;
    if (!(s->t < t_end))
        return DOP853_EEND;
    for (;;) {
        double h = s->h, h_free = h;
        int limited = 0;
        if (s->limit) {
            double hl = s->limit(s->t, s->y, s->fy, h, s->user);
            if (hl < h)
                h = hl, limited = 1;
        }
        if (0.1 * h <= fabs(s->t) * DBL_EPSILON)
            return failures ? DOP853_ERHS : DOP853_ESTEPSIZE; /* shrunk to nothing by failed evaluations */
        if (s->t + 1.01 * h >= t_end)
            h = t_end - s->t;
        memcpy(s->k[0], s->fy, sizeof s->fy);
        double ys[N], ynew[N];
        int bad = 0;
        for (int i = 1; i < 12 && !bad; i++) {
            stage_state(s->y, s->k, i, h, ys, s->n);
            bad = s->f(s->t + C[i] * h, ys, s->k[i], s->user) != 0;
            s->nfev++;
        }
        if (!bad) {
            /* The new state, and the error estimate, weighted per component. */
            double err5 = 0.0, err3 = 0.0;
            static const double zero[N] = {0.0};
            double bk[N];
            stage_state(zero, s->k, 12, 1.0, bk, s->n); /* sum_j b_j k_j */
            for (int n = 0; n < N; n++)
                ynew[n] = s->y[n] + h * bk[n];
            for (int n = 0; n < s->n; n++) {
                double e5 = E5[0] * s->k[0][n];
                for (int j = 5; j < 12; j++) /* E5[1..4] are zero */
                    e5 += E5[j] * s->k[j][n];
                double e3 = bk[n] - BHH1 * s->k[0][n] - BHH9 * s->k[8][n] - BHH12 * s->k[11][n];
                double sk = weight(s, s->y[n], ynew[n]);
                err5 += (e5 / sk) * (e5 / sk);
                err3 += (e3 / sk) * (e3 / sk);
            }
            double deno = err5 + 0.01 * err3;
            double err = fabs(h) * err5 * sqrt(1.0 / (s->n_err * (deno > 0.0 ? deno : 1.0)));
            double fac11 = pow(err, 1.0 / 8.0);
            if (!isfinite(err)) {
                bad = 1;
            } else if (err <= 1.0) {
                s->at_step_end = 1;
                int failed = s->f(s->t + h, ynew, s->k[12], s->user) != 0;
                s->at_step_end = 0;
                if (failed) {
                    s->nfev++;
                    bad = 1;
                } else {
                    s->nfev++;
                    s->facold = fmax(err, 1e-4);
                    double hnew = h / fmax(FAC_MIN, fmin(FAC_MAX, fac11 / SAFE));
                    if (s->rejected)
                        hnew = fmin(hnew, h);
                    if (limited) /* a step cut short says nothing against the step proposed before */
                        hnew = fmax(hnew, h_free);
                    s->rejected = 0;
                    s->t_old = s->t;
                    s->h_old = h;
                    memcpy(s->y_old, s->y, sizeof s->y);
                    memcpy(s->f_old, s->fy, sizeof s->fy);
                    s->t = (h == t_end - s->t) ? t_end : s->t + h;
                    memcpy(s->y, ynew, sizeof ynew);
                    memcpy(s->fy, s->k[12], sizeof s->fy);
                    s->h = hnew;
                    s->dense_ready = 0;
                    s->nsteps++;
                    return DOP853_OK;
                }
            } else {
                s->h = h / fmin(FAC_MAX, fac11 / SAFE);
                s->rejected = 1;
                s->nrejected++;
                continue;
            }
        }
        /* A stage could not be evaluated (or gave no finite error): retry much shorter. */
        if (++failures > DOP853_MAX_RETRIES)
            return DOP853_ERHS;
        s->h = 0.25 * h;
        s->rejected = 1;
        s->nrejected++;
    }
}

int dop853_dense(dop853 *s)
{
    if (s->dense_ready)
        return DOP853_OK;
    const double h = s->h_old;
    /* The stages are those of the accepted step (k[12] = f at its end); the extension adds three. */
    double ys[N];
    for (int i = 13; i < 16; i++) {
        stage_state(s->y_old, s->k, i, h, ys, s->n);
        int bad = s->f(s->t_old + C[i] * h, ys, s->k[i], s->user) != 0;
        s->nfev++;
        if (bad)
            return DOP853_ERHS;
    }
    for (int n = 0; n < s->n; n++) {
        double dy = s->y[n] - s->y_old[n];
        s->cont[0][n] = dy;
        s->cont[1][n] = h * s->f_old[n] - dy;
        s->cont[2][n] = 2.0 * dy - h * (s->fy[n] + s->f_old[n]);
        for (int r = 0; r < 4; r++) {
            double acc = 0.0;
            for (int j = 0; j < 16; j++)
                acc += DC[r][j] * s->k[j][n];
            s->cont[3 + r][n] = h * acc;
        }
    }
    s->dense_ready = 1;
    return DOP853_OK;
}

double dop853_dense_component(const dop853 *s, double t, int n)
{
    const double x = (t - s->t_old) / s->h_old, x1 = 1.0 - x;
    const double (*c)[N] = s->cont;
    return s->y_old[n] +
           x * (c[0][n] + x1 * (c[1][n] + x * (c[2][n] + x1 * (c[3][n] + x * (c[4][n] + x1 * (c[5][n] + x * c[6][n]))))));
}

void dop853_dense_eval(const dop853 *s, double t, double y[N])
{
    for (int n = 0; n < N; n++)
        y[n] = dop853_dense_component(s, t, n);
}

int dop853_partial(const dop853 *s, double tau, double y[N])
{
    double k[13][N], ys[N];
    memcpy(k[0], s->f_old, sizeof k[0]);
    for (int i = 1; i < 12; i++) {
        stage_state(s->y_old, k, i, tau, ys, s->n);
        if (s->f(s->t_old + C[i] * tau, ys, k[i], s->user) != 0)
            return DOP853_ERHS;
    }
    stage_state(s->y_old, k, 12, tau, y, s->n);
    return DOP853_OK;
}
