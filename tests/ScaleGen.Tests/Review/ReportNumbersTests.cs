using System.Text;
using CsCheck;
using ScaleGen.Emit;
using ScaleGen.Emit.Report;
using ScaleGen.Tests.Support;

namespace ScaleGen.Tests.Review;

/// <summary>The report's fast number text must be exactly what <see cref="DisplayNumbers"/> writes.</summary>
public class ReportNumbersTests
{
    private static string Fixed(double value, int decimals) => new StringBuilder("<").AppendFixed(value, decimals).ToString()[1..];

    [Theory]
    // ties in decimal that are not ties in binary, exact binary ties, "-0", huge and odd values
    [InlineData(0.25), InlineData(0.35), InlineData(2.675), InlineData(1.005), InlineData(0.125), InlineData(-0.125)]
    [InlineData(-0.04), InlineData(-0.05), InlineData(-0.0), InlineData(0.0), InlineData(0.05), InlineData(0.045)]
    [InlineData(99.95), InlineData(-99.95), InlineData(78.45), InlineData(1e9), InlineData(-1e9), InlineData(123456789.55)]
    [InlineData(1e20), InlineData(-3.5e300), InlineData(5e-324), InlineData(double.NaN), InlineData(double.PositiveInfinity)]
    public void Fixed_text_is_display_numbers_text(double value)
    {
        for (var decimals = 0; decimals <= 4; decimals++)
            Assert.Equal(DisplayNumbers.Fixed(value, decimals), Fixed(value, decimals));
    }

    [Fact]
    public void Fixed_text_is_display_numbers_text_for_any_double() =>
        Gen.Select(Gen.Double, Gen.Int[0, 4]).Sample((value, decimals) => DisplayNumbers.Fixed(value, decimals) == Fixed(value, decimals));

    [Fact]
    public void Fixed_text_is_display_numbers_text_near_ties() =>
        // Values a chart meets (coordinates, currents) with many near a half of the last digit.
        Gen.Select(Gen.Int[-500_000, 500_000], Gen.Int[-3, 3], Gen.Int[0, 4]).Sample((units, nudge, decimals) =>
        {
            var value = (units + 0.5) / Math.Pow(10, decimals);
            for (var i = 0; i < Math.Abs(nudge); i++) value = nudge > 0 ? Math.BitIncrement(value) : Math.BitDecrement(value);
            return DisplayNumbers.Fixed(value, decimals) == Fixed(value, decimals);
        });

    [Fact]
    public void Cached_texts_are_display_numbers_texts()
    {
        var numbers = new ReportNumbers();
        foreach (var value in new[] { 0.006000000000000001, 707.10678, -0.0, 12.5, 12.5, 1e-7, -3.25e5 })
        {
            Assert.Equal(DisplayNumbers.Exact(value), numbers.Exact(value));
            Assert.Equal(DisplayNumbers.Significant(value, 4), numbers.Significant4(value));
        }
    }

    [Fact]
    public void Fixed_text_does_not_follow_the_culture() =>
        Assert.Equal("-12.50", TestInputs.UnderCulture("de-DE", () => Fixed(-12.5, 2)));
}
