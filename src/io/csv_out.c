/* csv_out.c: trajectory samples as CSV (C locale, '.' decimal separator, 17 significant digits max).
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include <errno.h>
#include <string.h>

#include "dragarc/output.h"

int dragarc_flight_write_csv(FILE *fp, const dragarc_flight *f, dragarc_error *err)
{
    fputs("t,x,y,z,vx,vy,vz,speed,mach,reynolds\n", fp);
    for (size_t i = 0; i < f->npoints; i++) {
        const dragarc_flight_point *p = &f->points[i];
        double v[10] = {p->t, p->pos[0], p->pos[1], p->pos[2], p->vel[0], p->vel[1], p->vel[2], p->speed, p->mach, p->reynolds};
        for (int k = 0; k < 10; k++) {
            if (k)
                fputc(',', fp);
            dragarc_number_write(fp, v[k]); /* an empty cell for NaN or inf */
        }
        fputc('\n', fp);
    }
    if (ferror(fp))
        return dragarc_error_set(err, DRAGARC_EIO, "", "write failed: %s", strerror(errno));
    return DRAGARC_OK;
}
