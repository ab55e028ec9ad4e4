using VoxProf.Core.Calibration;
using VoxProf.Core.Statistics;

namespace VoxProf.Tests.Calibration;

public class CostFitterTests : IClassFixture<RingPostViews>
{
    private readonly RingPostViews _views;

    public CostFitterTests(RingPostViews views) => _views = views;

    private static readonly MeasureDefinition[] Features = [.. CostFeatures.Default];

    // Made-up costs of a made-up device, in ns: per pixel, per total iteration, per total node fetch, per slab test.
    private static readonly double[] TrueNs = [2.5, 0.8, 1.7, 0.35];

    private static double TrueMs(StrategyStatistics s) =>
        (TrueNs[0] * s.Pixels + Features.Select((f, k) => TrueNs[k + 1] * s[f.Name].Total).Sum()) / 1e6;

    private static CalibrationSample Sample(StrategyStatistics s, double ms) =>
        new(ms, s.Pixels, Features.Select(f => (double)s[f.Name].Total).ToArray());

    [Fact]
    public void Times_made_from_known_costs_on_real_traces_give_those_costs_back()
    {
        var samples = _views.Statistics.Select(s => Sample(s, TrueMs(s))).ToArray();

        CostFit fit = CostFitter.Fit(Features, samples);

        fit.Converged.Should().BeTrue();
        fit.Terms.Select(t => t.Name).Should().Equal("pixels", "total-iterations", "total-node-fetches", "slab-tests");
        for (int k = 0; k < TrueNs.Length; k++)
            fit.Terms[k].Nanoseconds.Should().BeApproximately(TrueNs[k], TrueNs[k] * 1e-6, fit.Terms[k].Name);
        fit.RSquared.Should().BeApproximately(1, 1e-9);
        fit.LooRmsErrorMs.Should().BeLessThan(1e-9);
        fit.Samples.Should().OnlyContain(r => Math.Abs(r.ResidualMs) < 1e-9);
    }

    [Fact]
    public void Seeded_measurement_noise_of_two_percent_still_predicts_the_true_times_and_leave_one_out_tells_the_noise()
    {
        var rng = new Random(11);
        var noisy = _views.Statistics.Select(s => Sample(s, TrueMs(s) * (1 + (rng.NextDouble() - 0.5) * 0.04))).ToArray();

        CostFit fit = CostFitter.Fit(Features, noisy);

        fit.RSquared.Should().BeGreaterThan(0.99);
        // Prediction of a left-out view is worse than the fit of a seen one, and of the size of the noise (±2%,
        // mean |noise| 1%).
        fit.LooRmsErrorMs.Should().BeGreaterThan(fit.RmsResidualMs);
        fit.LooMeanAbsPercent.Should().BeInRange(0.5, 3);
        fit.Samples.Select(s => s.FittedMs + s.ResidualMs).Should().Equal(noisy.Select(s => s.MeasuredMs), (a, b) => Math.Abs(a - b) < 1e-12);
        // Correlated counters trade cost between them under noise (here the per-pixel cost, small beside the walk's,
        // moves most), but the model's times stay near the noise-free truth: within 1% on average, 5% at worst.
        var model = new CostModel("test", fit.Terms, new FitScope([], []));
        double[] off = _views.Statistics.Select(s => Math.Abs(model.PredictMs(s) / TrueMs(s) - 1)).ToArray();
        off.Average().Should().BeLessThan(0.01);
        off.Max().Should().BeLessThan(0.05);
        for (int k = 0; k < TrueNs.Length; k++)
            fit.Terms[k].Nanoseconds.Should().BeApproximately(TrueNs[k], TrueNs[k] * 0.3, fit.Terms[k].Name);
    }

    [Fact]
    public void A_negative_unconstrained_cost_is_held_at_zero()
    {
        // Time that falls as slab tests rise: least squares would price a slab test below zero; NNLS prices it 0.
        var samples = _views.Statistics
            .Select(s => Sample(s, (3.0 * s.Pixels + 1.0 * s["total-iterations"].Total - 0.5 * s["slab-tests"].Total) / 1e6))
            .Where(s => s.MeasuredMs > 0).ToArray();

        CostFit fit = CostFitter.Fit(Features, samples);

        fit.Terms.Single(t => t.Name == "slab-tests").Nanoseconds.Should().Be(0);
        fit.Terms.Should().OnlyContain(t => t.Nanoseconds >= 0);
        fit.RSquared.Should().BeLessThan(1);
    }

    [Fact]
    public void A_feature_equal_to_another_is_reported_as_an_exact_dependency()
    {
        // Without the prepass, total-iterations is iterations itself.
        var plain = _views.Statistics.Where(s => s["prepass-iterations"].Total == 0).ToArray();
        MeasureDefinition[] features = [Measures.TotalIterations, Measures.Find("iterations")!, Measures.TotalNodeFetches];
        var samples = plain.Select(s => new CalibrationSample(TrueMs(s), s.Pixels, features.Select(f => (double)s[f.Name].Total).ToArray())).ToArray();

        CostFit fit = CostFitter.Fit(features, samples);

        fit.Collinearity.ConditionNumber.Should().Be(double.PositiveInfinity);
        // Columns: 0 pixels, 1 total-iterations, 2 iterations, 3 total-node-fetches.
        fit.Collinearity.Dependencies.Should().Contain(d => d.Columns.SequenceEqual(new[] { 1, 2 }));
        fit.Converged.Should().BeTrue();
    }

    [Fact]
    public void A_feature_that_is_zero_in_every_sample_is_undetermined_and_costs_nothing()
    {
        var plain = _views.Statistics.Where(s => s["prepass-iterations"].Total == 0).ToArray();
        MeasureDefinition[] features = [Measures.TotalIterations, Measures.Find("prepass-iterations")!];
        var samples = plain.Select(s => new CalibrationSample(TrueMs(s), s.Pixels, features.Select(f => (double)s[f.Name].Total).ToArray())).ToArray();

        CostFit fit = CostFitter.Fit(features, samples);

        fit.Undetermined.Select(m => m.Name).Should().Equal("prepass-iterations");
        fit.Terms[2].Nanoseconds.Should().Be(0);
        fit.Collinearity.Dependencies.Should().NotContain(d => d.Columns.Contains(2));
    }

    [Fact]
    public void Fewer_samples_than_costs_plus_one_is_refused()
    {
        var samples = _views.Statistics.Take(4).Select(s => Sample(s, TrueMs(s))).ToArray();

        CostFitter.MinimumSamples(Features.Length).Should().Be(5);
        FluentActions.Invoking(() => CostFitter.Fit(Features, samples)).Should().Throw<ArgumentException>();
    }

    [Fact]
    public void A_model_predicts_a_frame_as_the_sum_of_its_pixels_picoseconds()
    {
        var model = new CostModel("test device", Features.Select((f, k) => new CostTerm(f, TrueNs[k + 1])).Prepend(new CostTerm(null, TrueNs[0])).ToArray(),
            new FitScope([4], [new ImageSize(RingPostViews.Width, RingPostViews.Height)]));
        foreach (var run in _views.Runs.Take(2))
        {
            foreach (var result in run.Results)
            {
                var stats = StrategyStatistics.Compute(result, run.Reference);
                double ms = model.PredictMs(stats);
                ms.Should().BeApproximately(TrueMs(stats), 1e-12);
                uint[] ps = model.PixelPicoseconds(result);
                // Each pixel rounds to the nearest picosecond: the frame sum is within half a picosecond per pixel.
                (ps.Sum(v => (double)v) / 1e9).Should().BeApproximately(ms, ps.Length * 0.5e-9);
            }
        }
    }

    [Fact]
    public void A_trace_of_another_branching_or_size_gets_one_line_naming_both()
    {
        var model = new CostModel("Lab card", [new CostTerm(null, 1)], new FitScope([4], [new ImageSize(1280, 720), new ImageSize(640, 360)]));

        model.ScopeWarning(4, 640, 360).Should().BeNull();
        model.ScopeWarning(2, 1280, 720).Should().Be(
            "calibration for Lab card was fitted on branching 4, this trace uses branching 2: predicted-ms may not hold");
        model.ScopeWarning(2, 320, 180).Should().Be(
            "calibration for Lab card was fitted on branching 4 and 1280x720 or 640x360 images, this trace uses branching 2 and 320x180 images: predicted-ms may not hold");
    }
}
