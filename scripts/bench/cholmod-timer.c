/*
 * CHOLMOD timer for `npm run bench:solver` (built by the bench only when libsuitesparse-dev is installed).
 * Reads K_ff (one triangle, Matrix Market) and picks the ordering with the smallest L among CHOLMOD's AMD,
 * METIS and NESDIS (as our solver picks between minimum degree and nested dissection); then, with only that
 * ordering, times analysis, factorisation and the solve of NRHS right-hand sides of ones in CPU seconds of
 * this process (the fair best case for CHOLMOD: the trial of the other orderings is not counted).
 * Prints one JSON line: nnz(L) below the diagonal, the ordering chosen and the step times.
 * Usage: cholmod-timer matrix.mtx nrhs
 */
#include <stdio.h>
#include <stdlib.h>
#include <time.h>
#include <cholmod.h>

static double cpu(void) {
  struct timespec t;
  clock_gettime(CLOCK_PROCESS_CPUTIME_ID, &t);
  return t.tv_sec + 1e-9 * t.tv_nsec;
}

int main(int argc, char **argv) {
  if (argc != 3) {
    fprintf(stderr, "usage: %s matrix.mtx nrhs\n", argv[0]);
    return 2;
  }
  FILE *f = fopen(argv[1], "r");
  if (!f) {
    perror(argv[1]);
    return 2;
  }
  int nrhs = atoi(argv[2]);
  cholmod_common c;
  cholmod_start(&c);
  c.nmethods = 3;
  c.method[0].ordering = CHOLMOD_AMD;
  c.method[1].ordering = CHOLMOD_METIS;
  c.method[2].ordering = CHOLMOD_NESDIS;
  cholmod_sparse *A = cholmod_read_sparse(f, &c);
  fclose(f);
  if (!A) return 1;
  cholmod_dense *B = cholmod_ones(A->nrow, nrhs, CHOLMOD_REAL, &c);
  cholmod_factor *L = cholmod_analyze(A, &c);
  if (!L) return 1;
  int chosen = c.method[c.selected].ordering;
  cholmod_free_factor(&L, &c);
  c.nmethods = 1;
  c.method[0].ordering = chosen;
  double t0 = cpu();
  L = cholmod_analyze(A, &c);
  double t1 = cpu();
  cholmod_factorize(A, L, &c);
  double t2 = cpu();
  cholmod_dense *X = cholmod_solve(CHOLMOD_A, L, B, &c);
  double t3 = cpu();
  if (!X || c.status != CHOLMOD_OK) return 1;
  const char *method = chosen == CHOLMOD_METIS ? "METIS" : chosen == CHOLMOD_NESDIS ? "NESDIS" : chosen == CHOLMOD_AMD ? "AMD" : "other";
  printf("{\"n\":%d,\"nnzL\":%.0f,\"ordering\":\"%s\",\"analyze\":%.4f,\"factor\":%.4f,\"solve\":%.4f}\n",
         (int)A->nrow, c.lnz - (double)A->nrow, method, t1 - t0, t2 - t1, t3 - t2);
  cholmod_free_dense(&X, &c);
  cholmod_free_dense(&B, &c);
  cholmod_free_factor(&L, &c);
  cholmod_free_sparse(&A, &c);
  cholmod_finish(&c);
  return 0;
}
