/* Times FFTW's real-to-complex transform (fftw_plan_dft_r2c_1d, planned with
 * FFTW_MEASURE, out of place) at the lengths given on the command line, the
 * reference beside numpy for the Go FFT benchmarks.
 *
 * Build and run (tools/bench does this):
 *   gcc -O2 -o /tmp/fftw_bench bench/fftw_bench.c -lfftw3 -lm
 *   /tmp/fftw_bench 1024 4096 ...
 * Prints one JSON object: {"fftw": version, "r2c_ns": {"N": ns, ...}}, the
 * median over 5 repeats of the mean time per transform, each repeat running
 * for at least 0.2 s.
 */
#include <fftw3.h>
#include <stdio.h>
#include <stdlib.h>
#include <time.h>

static double now(void) {
	struct timespec ts;
	clock_gettime(CLOCK_MONOTONIC, &ts);
	return ts.tv_sec + 1e-9 * ts.tv_nsec;
}

static int cmp(const void *a, const void *b) {
	double x = *(const double *)a, y = *(const double *)b;
	return (x > y) - (x < y);
}

int main(int argc, char **argv) {
	printf("{\"fftw\": \"%s\", \"r2c_ns\": {", fftw_version);
	for (int a = 1; a < argc; a++) {
		int n = atoi(argv[a]);
		double *in = fftw_alloc_real(n);
		fftw_complex *out = fftw_alloc_complex(n / 2 + 1);
		fftw_plan p = fftw_plan_dft_r2c_1d(n, in, out, FFTW_MEASURE);
		srand(5);
		for (int i = 0; i < n; i++) in[i] = rand() / (double)RAND_MAX - 0.5;
		/* Calibrate the count so that one repeat lasts >= 0.2 s. */
		long count = 1;
		for (;;) {
			double t0 = now();
			for (long i = 0; i < count; i++) fftw_execute(p);
			if (now() - t0 >= 0.2) break;
			count *= 2;
		}
		double rep[5];
		for (int r = 0; r < 5; r++) {
			double t0 = now();
			for (long i = 0; i < count; i++) fftw_execute(p);
			rep[r] = (now() - t0) / count * 1e9;
		}
		qsort(rep, 5, sizeof rep[0], cmp);
		printf("%s\"%d\": %.1f", a > 1 ? ", " : "", n, rep[2]);
		fftw_destroy_plan(p);
		fftw_free(in);
		fftw_free(out);
	}
	printf("}}\n");
	return 0;
}
