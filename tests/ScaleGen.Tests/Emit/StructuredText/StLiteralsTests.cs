using System.Globalization;
using System.Text.RegularExpressions;
using CsCheck;
using ScaleGen.Emit.StructuredText;
using ScaleGen.Tests.Support;

namespace ScaleGen.Tests.Emit.StructuredText;

public class StLiteralsTests
{
    [Theory]
    [InlineData(0.1, "0.1")]
    [InlineData(5.0, "5.0")]
    [InlineData(-2.5, "-2.5")]
    [InlineData(0.0, "0.0")]
    [InlineData(1e-5, "1.0E-5")]
    [InlineData(1.234e-5, "1.234E-5")]
    [InlineData(1.5e20, "1.5E20")]
    [InlineData(15.0 / 27648.0, "0.00054253475")]
    [InlineData(1e39, "3.4028235E38")] // beyond REAL: the largest REAL
    [InlineData(-1e39, "-3.4028235E38")]
    public void Real_literals_are_shortest_float_round_trip_in_IEC_form(double value, string expected) =>
        Assert.Equal(expected, StLiterals.Real(value));

    [Fact]
    public void Negative_zero_is_plain_zero() => Assert.Equal("0.0", StLiterals.Real(-0.0));

    [Fact]
    public void Real_literals_round_trip_as_float_for_any_double()
    {
        var form = new Regex(@"^-?\d+\.\d+(E-?\d+)?$");
        Gen.Double.Where(d => double.IsFinite(d) && Math.Abs(d) < 3e38).Sample(d =>
        {
            var text = StLiterals.Real(d);
            return form.IsMatch(text) && float.Parse(text, CultureInfo.InvariantCulture) == (float)d;
        });
    }

    [Fact]
    public void Real_literals_do_not_follow_the_culture() =>
        Assert.Equal("0.5", TestInputs.UnderCulture("de-DE", () => StLiterals.Real(0.5)));

    [Theory]
    [InlineData(0L, "T#0s")]
    [InlineData(5_000_000L, "T#5s")]
    [InlineData(150_000L, "T#150ms")]
    [InlineData(60_000_000L, "T#1m")]
    [InlineData(90_000_000L, "T#1m30s")]
    [InlineData(60_500_000L, "T#1m0s500ms")]
    [InlineData(1_500L, "T#1ms500us")]
    [InlineData(3_600_000_000L, "T#1h")]
    public void Time_literals(long microseconds, string expected) =>
        Assert.Equal(expected, StLiterals.Time(microseconds));

    [Fact]
    public void Delays_are_whole_cycles()
    {
        Assert.Equal("T#5s", StLiterals.TimeOfScans(50, 0.1));
        Assert.Equal("T#300ms", StLiterals.TimeOfScans(3, 0.1));
        Assert.Equal("T#37ms500us", StLiterals.TimeOfScans(3, 0.0125));
    }
}
