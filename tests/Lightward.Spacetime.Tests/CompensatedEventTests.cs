namespace Lightward.Spacetime.Tests;

public class CompensatedEventTests
{
    [Fact]
    public void Sums_stay_exact_through_cancellation_and_below_one_unit_in_the_last_place()
    {
        // A double-double hi + lo holds these sums of powers of two exactly (Dekker 1971, "A floating-point technique
        // for extending the available precision"; Knuth, TAOCP vol. 2, §4.2.2), including when the high part cancels
        // to zero and only the low part is left.
        double far = Math.Pow(2, 40);
        var e = new CompensatedEvent(new FourVector(0, far + 0.5, -far, 1));
        e = e.Add(new FourVector(Math.Pow(2, -60), -far, far, Math.Pow(2, -60)));
        Assert.Equal(new FourVector(Math.Pow(2, -60), 0.5, 0, 1), e.High);
        Assert.Equal(new FourVector(0, 0, 0, Math.Pow(2, -60)), e.Low);
        e = e.Add(new FourVector(0, Math.Pow(2, -60), 0, -1));
        Assert.Equal(new FourVector(Math.Pow(2, -60), 0.5, 0, Math.Pow(2, -60)), e.High);
        Assert.Equal(new FourVector(0, Math.Pow(2, -60), 0, 0), e.Low);
        e = e.Add(new FourVector(0, -0.5, 0, 0));
        Assert.Equal(Math.Pow(2, -60), e.High.X);
        Assert.Equal(0, e.Low.X);
    }
}
